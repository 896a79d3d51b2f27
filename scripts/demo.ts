/** `npm run demo`: builds Loamwork if needed and serves the demo site at http://localhost:3000. */
import { ensureBuilt, startStack } from "./stack";

const port = Number(process.env.PORT ?? 3000);
ensureBuilt();
const stack = await startStack({ port, dataDir: process.env.LOAMWORK_DEMO_DIR ?? ".data/demo" });
console.log(`\nLoamwork is serving the demo site at ${stack.url} — press Ctrl+C to stop.`);
const stop = async () => {
  await stack.stop();
  process.exit(0);
};
process.on("SIGINT", stop);
process.on("SIGTERM", stop);
