import { describe, expect, it } from "vitest";
import { call, session } from "../support/harness";
import { makeSite } from "../support/fixtures";
import { api, type ApiName, type ApiOperation } from "@/lib/api/catalog";
import * as classesRoute from "@/app/api/sites/[siteId]/classes/route";
import * as findsRoute from "@/app/api/sites/[siteId]/finds/route";
import * as invitationsRoute from "@/app/api/sites/[siteId]/invitations/route";
import * as membersRoute from "@/app/api/sites/[siteId]/members/route";
import * as relationsRoute from "@/app/api/sites/[siteId]/relations/route";
import * as contextsRoute from "@/app/api/sites/[siteId]/contexts/route";

/** Reads a list as the browser does and checks the answer against the catalogue's response schema. */
async function readAs(name: ApiName, mod: Parameters<typeof call>[0], siteId: string, query?: Record<string, string>) {
  const res = await call(mod, "GET", { siteId }, undefined, query);
  expect(res.status, JSON.stringify(res.json)).toBe(200);
  const schema = (api[name] as ApiOperation).response;
  if (!schema) throw new Error(`${name} has no response schema`);
  expect(schema.safeParse(res.json).error?.issues ?? []).toEqual([]);
  return res.json;
}

describe("what the lists answer fits the catalogue's response schemas", () => {
  it("classes, members, finds, relations (both readings) and invitations", async () => {
    const fx = await makeSite();
    session.userId = fx.people.director.id;
    const siteId = fx.site.id;
    const made = await call(
      findsRoute,
      "POST",
      { siteId },
      { contextId: fx.context.id, classId: fx.cls.id, x: 1.5, y: 1.5, z: 10.2 },
    );
    expect(made.status).toBe(201);
    const other = await call(
      contextsRoute,
      "POST",
      { siteId },
      { trenchId: fx.trench.id, number: 9000 + (fx.context.number % 1000), type: "fill" },
    );
    expect(other.status, JSON.stringify(other.json)).toBe(201);
    expect(
      (
        await call(
          relationsRoute,
          "POST",
          { siteId },
          { contextId: fx.context.id, reading: "above", otherId: other.json.id },
        )
      ).status,
    ).toBe(201);
    expect(
      (await call(invitationsRoute, "POST", { siteId }, { email: "new.digger@test.invalid", role: "digger" })).status,
    ).toBe(201);

    expect((await readAs("classesList", classesRoute, siteId)).map((c: { code: string }) => c.code)).toEqual(["FL"]);
    expect((await readAs("membersList", membersRoute, siteId)).length).toBe(3);
    const page = await readAs("findsList", findsRoute, siteId, { trenchId: fx.trench.id });
    expect(page.rows.map((r: { number: number; z: number }) => [r.number, r.z])).toEqual([[made.json.number, 10.2]]);
    expect((await readAs("relationsList", relationsRoute, siteId, { contextId: fx.context.id }))[0].otherId).toBe(
      other.json.id,
    );
    expect((await readAs("relationsList", relationsRoute, siteId)).length).toBe(1);
    expect((await readAs("invitationsList", invitationsRoute, siteId))[0].status).toBe("pending");
  });
});
