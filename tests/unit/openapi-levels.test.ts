import { describe, expect, it } from "vitest";
import { REDUCED_LEVEL_WORDS } from "@/lib/schemas/common";
import { buildOpenApiDocument } from "@/lib/server/openapi";

/** The API's own description says what a find's or a sample's z is: a reduced level against the site datum. */
describe("the OpenAPI document names z as a reduced level", () => {
  const doc = buildOpenApiDocument() as unknown as {
    paths: Record<string, Record<string, { requestBody?: { content: Record<string, { schema: unknown }> } }>>;
  };
  const bodyOf = (path: string, method: string) => {
    const schema = doc.paths[path]?.[method]?.requestBody?.content["application/json"]?.schema;
    return JSON.stringify(schema ?? null);
  };

  it.each([
    ["/api/sites/{siteId}/finds", "post"],
    ["/api/sites/{siteId}/finds/{findId}", "patch"],
    ["/api/sites/{siteId}/samples", "post"],
  ])("%s %s", (path, method) => {
    const body = bodyOf(path, method);
    expect(body).toContain('"z"');
    expect(body).toContain(REDUCED_LEVEL_WORDS);
  });
});
