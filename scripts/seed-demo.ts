import { closeDb, getDb } from "@/db/client";
import { DEMO_USERS, seedDemo } from "@/db/seed-demo";

/** `npm run seed`: creates the invented demo site (once) and prints the demo sign-ins. */
const db = await getDb();
const { created } = await seedDemo(db);
await closeDb();
console.log(created ? "Demo site Whinnydale Holm created." : "Demo site already present; nothing changed.");
console.log("Demo sign-ins:");
for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(10)} ${u.email.padEnd(28)} ${u.password}`);
