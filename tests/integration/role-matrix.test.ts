import { describe, expect, it } from "vitest";
import { session, call } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { getDb } from "@/db/client";
import * as schema from "@/db/schema";
import { api, type ApiOperation } from "@/lib/server/api-catalog";
import { archiveCases } from "./role-cases/archive";
import { coreCases } from "./role-cases/core";
import { levelsCases } from "./role-cases/levels";
import { offlineCases } from "./role-cases/offline";
import { packagesCases } from "./role-cases/packages";
import { patternsCases } from "./role-cases/patterns";
import { planCases } from "./role-cases/plan";
import { recordingCases } from "./role-cases/recording";
import { signOffCases } from "./role-cases/sign-off";
import { squaresCases } from "./role-cases/squares";

const writes = {
  ...coreCases,
  ...planCases,
  ...recordingCases,
  ...signOffCases,
  ...patternsCases,
  ...levelsCases,
  ...squaresCases,
  ...archiveCases,
  ...offlineCases,
  ...packagesCases,
};

/** Every row of every table except the append-only audit trail, as JSON, to prove a refusal changed nothing. */
async function snapshot(): Promise<string> {
  const db = await getDb();
  const tables = [
    schema.sites,
    schema.memberships,
    schema.users,
    schema.trenches,
    schema.contexts,
    schema.contextRelations,
    schema.artefactClasses,
    schema.finds,
    schema.squareSamples,
    schema.squareCounts,
    schema.samples,
    schema.drawings,
    schema.drawingContexts,
  ];
  const parts = [];
  for (const t of tables) parts.push(JSON.stringify(await db.select().from(t)));
  // Packages are counted, not compared: a package started by an earlier case may still be writing progress.
  parts.push(String((await db.select().from(schema.depositionPackages)).length));
  const audit = await db.select().from(schema.auditEntries);
  parts.push(String(audit.length));
  return parts.join("\n");
}

const callers = ["signed-out", "stranger", "digger", "specialist", "director"] as const;

function expectedStatus(op: ApiOperation, who: (typeof callers)[number]): number {
  if (who === "signed-out") return 401;
  if (!op.roles) return op.successStatus ?? 200;
  if (who === "stranger") return 404;
  if (op.roles === "member" || op.roles.includes(who)) return op.successStatus ?? 200;
  return 403;
}

describe("every mutating route × every caller", () => {
  const mutating = (Object.entries(api) as [string, ApiOperation][]).filter(
    ([, op]) => op.method !== "GET" && !op.public,
  );

  it("has a case for every mutating operation in the catalogue", () => {
    expect(mutating.map(([name]) => name).sort()).toEqual(Object.keys(writes).sort());
  });

  for (const [name, op] of mutating) {
    for (const who of callers) {
      const want = expectedStatus(op, who);
      it(`${op.method} ${op.path} as ${who} → ${want}`, async () => {
        const fx = await makeSite();
        const prepared = await writes[name](fx);
        session.userId = who === "signed-out" ? null : fx.people[who].id;
        const before = await snapshot();
        const res = await call(prepared.mod, op.method, prepared.params, prepared.body, prepared.query);
        expect(res.status, JSON.stringify(res.json)).toBe(want);
        if (want >= 400) {
          expect(typeof res.json.error).toBe("string");
          expect(await snapshot()).toBe(before);
        } else {
          expect(await snapshot()).not.toBe(before);
          // The answer is what the catalogue tells the browser to expect.
          if (op.response) expect(op.response.safeParse(res.json).error?.issues ?? []).toEqual([]);
        }
      });
    }
  }
});
