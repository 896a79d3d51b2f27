import { OpenApiGeneratorV31, OpenAPIRegistry } from "@asteasolutions/zod-to-openapi";
import { z, type ZodObject, type ZodRawShape } from "zod";
import { api, type ApiOperation } from "./api-catalog";

const errorBody = z.object({ error: z.string(), fieldErrors: z.record(z.string(), z.array(z.string())).optional() });

function pathParams(path: string) {
  const names = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
  return names.length ? z.object(Object.fromEntries(names.map((n) => [n, z.string().uuid()]))) : undefined;
}

function roleNote(op: ApiOperation) {
  if (op.public) return "No sign-in: the request proves its right with a single-use token.";
  if (!op.roles) return "Any signed-in user.";
  if (op.roles === "member") return "Any member of the site.";
  return `Site roles: ${op.roles.join(", ")}.`;
}

/** The OpenAPI 3.1 document, generated from the same zod schemas the handlers validate with. */
export function buildOpenApiDocument() {
  const registry = new OpenAPIRegistry();
  for (const [name, op] of Object.entries(api) as [string, ApiOperation][]) {
    const from = op.from ?? (op.method === "GET" || op.method === "DELETE" ? "query" : "body");
    const params = pathParams(op.path);
    registry.registerPath({
      operationId: name,
      method: op.method.toLowerCase() as "get" | "post" | "patch" | "delete",
      path: op.path,
      summary: op.summary,
      description: roleNote(op),
      request: {
        ...(params && { params }),
        ...(op.input && from === "query" && { query: op.input as ZodObject<ZodRawShape> }),
        ...(op.input && from === "body" && { body: { content: { "application/json": { schema: op.input } } } }),
      },
      responses: {
        [op.successStatus ?? 200]: { description: "Done" },
        400: {
          description: "Invalid input, with field errors",
          content: { "application/json": { schema: errorBody } },
        },
        401: { description: "Not signed in" },
        403: { description: "Your role on this site does not allow it" },
        404: { description: "Not found (or not a member of the site)" },
        409: { description: "Conflict: taken number, signed-off record, records that depend on it" },
      },
    });
  }
  registry.registerPath({
    method: "get",
    path: "/api/health",
    summary: "Liveness and database check",
    responses: { 200: { description: "Healthy" } },
  });
  const generator = new OpenApiGeneratorV31(registry.definitions);
  return generator.generateDocument({
    openapi: "3.1.0",
    info: {
      title: "Loamwork API",
      version: "0.1.0",
      description: "Excavation finds recording and distribution tests.",
    },
  });
}
