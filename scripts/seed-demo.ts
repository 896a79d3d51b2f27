import { closeDb, getDb } from "@/db/client";
import { DEMO_USERS, seedDemo } from "@/scripts/seed/seed-demo";
import { seedDemoPhoto } from "@/scripts/seed/seed-demo-photo";

/**
 * `npm run seed` (after `npm run build`, which compiles it to dist/seed-demo.mjs): creates the invented demo
 * site and its fitted trench photo (once each) and prints the demo sign-ins. From source it needs the
 * react-server condition, under which the server modules it reuses load (scripts/stack.ts runs it so).
 */
const db = await getDb();
const { created } = await seedDemo(db);
const photo = await seedDemoPhoto(db);
await closeDb();
console.log(created ? "Demo site Whinnydale Holm created." : "Demo site already present; nothing changed.");
if (photo) console.log("Synthetic photo of trench A added and fitted to the site grid.");
console.log("Demo sign-ins:");
for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(10)} ${u.email.padEnd(28)} ${u.password}`);
