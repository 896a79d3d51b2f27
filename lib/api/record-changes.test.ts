import { describe, expect, it } from "vitest";
import { buildRequest } from "./client";
import { announceWrite, keyNamesSite, onRecordsChanged, siteOfWrite } from "./record-changes";

const site = "6f1c2a8e-6a59-4a2b-9a57-6c1f3f0f9b21";
const other = "0b7d7c1e-1d2f-4a3b-8c4d-5e6f7a8b9c0d";

describe("record changes", () => {
  it("reads the site from a write's path, and nothing from a path outside a site", () => {
    expect(
      siteOfWrite(
        buildRequest("relationsCreate", { siteId: site }, { contextId: other, reading: "above", otherId: other }).url,
      ),
    ).toBe(site);
    expect(siteOfWrite(`/api/sites/${site}?x=1`)).toBe(site);
    expect(siteOfWrite("/api/sites")).toBeNull();
  });

  it("marks every query of the site stale and none of another site", () => {
    expect(keyNamesSite(["relations", site, other], site)).toBe(true);
    expect(keyNamesSite(["plan-finds", site, other], site)).toBe(true);
    expect(keyNamesSite(["relations", other, site + "x"], site)).toBe(false);
  });

  it("tells each listener of a write until it stops listening", () => {
    const heard: string[] = [];
    const stop = onRecordsChanged((req) => heard.push(req.url));
    announceWrite(buildRequest("relationDelete", { siteId: site, relationId: other }));
    stop();
    announceWrite(buildRequest("relationDelete", { siteId: site, relationId: other }));
    expect(heard).toEqual([`/api/sites/${site}/relations/${other}`]);
  });
});
