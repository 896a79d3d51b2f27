/**
 * Loamwork's distribution tests from the command line:
 *   npm run spatial -- INPUT.json [--progress]     or     cat INPUT.json | npm run spatial
 * prints the result as JSON on stdout. Bad input prints {"error": {...}} and exits with code 2. The input
 * format is described in docs/spatial-cli.md.
 */
import { readFileSync } from "node:fs";
import { SpatialInputError, runDistributionTest } from "../lib/spatial";
import { createSimulationPool } from "../lib/server/jobs/thread-pool";

async function readInput(path: string | undefined): Promise<string> {
  if (path && path !== "-") return readFileSync(path, "utf8");
  if (process.stdin.isTTY)
    throw new SpatialInputError("Give an input file (npm run spatial -- INPUT.json) or pipe JSON on stdin.");
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString("utf8");
}

function fail(kind: string, message: string): never {
  process.stdout.write(`${JSON.stringify({ error: { kind, message } }, null, 2)}\n`);
  process.exit(2);
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const progress = args.includes("--progress");
  const path = args.find((a) => !a.startsWith("--"));
  let text: string;
  try {
    text = await readInput(path);
  } catch (error) {
    fail("input", error instanceof Error ? error.message : String(error));
  }
  let spec: unknown;
  try {
    spec = JSON.parse(text);
  } catch (error) {
    fail("input", `The input is not valid JSON: ${(error as Error).message}`);
  }
  const controller = new AbortController();
  process.once("SIGINT", () => controller.abort());
  try {
    const result = await runDistributionTest(spec, {
      signal: controller.signal,
      createPool: (threads) => createSimulationPool({ threads }),
      onProgress: progress ? (f) => process.stderr.write(`progress ${(100 * f).toFixed(0)} %\n`) : undefined,
    });
    process.stdout.write(`${JSON.stringify(result)}\n`);
  } catch (error) {
    if (error instanceof SpatialInputError) fail("input", error.message);
    if (error instanceof Error && error.name === "AbortError") fail("cancelled", error.message);
    throw error;
  }
}

main().catch((error: unknown) => {
  process.stdout.write(`${JSON.stringify({ error: { kind: "internal", message: String(error) } })}\n`);
  process.exit(1);
});
