import { expect, it } from "vitest";
import { eq } from "drizzle-orm";
import "../support/harness";
import { seedDemoSite } from "../support/demo-site";
import { getDb } from "@/db/client";
import * as s from "@/db/schema";
import { register } from "@/instrumentation";

it("a package a stopped server left half-written is written again when the server starts", async () => {
  const demo = await seedDemoSite();
  const db = await getDb();
  const [left] = await db
    .insert(s.depositionPackages)
    .values({ siteId: demo.siteId, createdBy: demo.people.director!, status: "running", filesDone: 3, filesTotal: 20 })
    .returning();
  process.env.NEXT_RUNTIME = "nodejs";
  await register();
  // Nothing else starts the package queue here: only the server's start can pick the package up again.
  let row = left!;
  for (let waited = 0; row.status !== "done" && row.status !== "failed" && waited < 90_000; waited += 250) {
    await new Promise((r) => setTimeout(r, 250));
    [row] = await db.select().from(s.depositionPackages).where(eq(s.depositionPackages.id, left!.id));
  }
  expect(row.status).toBe("done");
  expect(row.filesDone).toBe(row.filesTotal);
  expect(row.fingerprint).toMatch(/^[0-9a-f]{64}$/);
}, 180_000);
