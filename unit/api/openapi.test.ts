import { Validator } from "@seriousme/openapi-schema-validator";
import { describe, expect, it } from "vitest";
import { openApiDocument } from "~/api/openapi";
import { runJsonSchema } from "~/checker/json-schema";
import routes from "~/routes";

type RouteNode = { path?: string; file: string; index?: boolean; children?: RouteNode[] };

/** Every URL pattern of app/routes.ts, with nested paths joined, e.g. `api/v1/submissions/:submissionId`. */
function routePatterns(nodes: RouteNode[], parent = ""): { pattern: string; file: string }[] {
  return nodes.flatMap((n) => {
    const here = [parent, n.path ?? ""].filter(Boolean).join("/");
    return [...(n.path !== undefined || n.index ? [{ pattern: here, file: n.file }] : []), ...routePatterns(n.children ?? [], here)];
  });
}

const toOpenApiPath = (pattern: string) => `/${pattern.replace(/:([A-Za-z0-9_]+)/g, "{$1}")}`;

// The catch-all `api/v1/*` only answers a JSON 404 for unknown addresses; it is no endpoint.
const CATCH_ALL = "api/v1/*";
const apiRoutes = routePatterns(routes as unknown as RouteNode[]).filter((r) => r.pattern.startsWith("api/v1/") && r.pattern !== CATCH_ALL);

describe("OpenAPI document", () => {
  const doc = openApiDocument() as unknown as { openapi: string; paths: Record<string, Record<string, unknown>>; components: { schemas: Record<string, { required?: string[] }> } };

  it("is a valid OpenAPI 3.1 document (checked by @seriousme/openapi-schema-validator)", async () => {
    const validator = new Validator();
    const result = await validator.validate(JSON.parse(JSON.stringify(doc)));
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe("3.1");
  });

  it("documents every route under /api/v1/ in app/routes.ts, and nothing that is not a route", () => {
    expect(apiRoutes.length).toBeGreaterThanOrEqual(10);
    const documented = Object.keys(doc.paths);
    for (const r of apiRoutes) expect(documented, `${r.pattern} (${r.file}) has no entry in app/api/openapi.ts`).toContain(toOpenApiPath(r.pattern));
    const routed = apiRoutes.map((r) => toOpenApiPath(r.pattern));
    for (const path of documented) expect(routed, `${path} is documented but not routed`).toContain(path);
  });

  it("has the JSON catch-all for unknown API addresses", () => {
    expect(routePatterns(routes as unknown as RouteNode[]).map((r) => r.pattern)).toContain(CATCH_ALL);
  });

  it("documents a method only where the route module has the export that serves it", async () => {
    for (const r of apiRoutes) {
      const mod = (await import(/* @vite-ignore */ `../../app/${r.file}`)) as Record<string, unknown>;
      const ops = doc.paths[toOpenApiPath(r.pattern)] ?? {};
      if ("get" in ops) expect(typeof mod.loader, `${r.file} documents GET`).toBe("function");
      if ("post" in ops || "put" in ops) expect(typeof mod.action, `${r.file} documents a write`).toBe("function");
    }
  });

  it("describes run records with the same zod schema the routes parse (required keys match /schemas/run-1.json)", () => {
    const fromDoc = doc.components.schemas.RunRecord;
    expect(fromDoc, "RunRecord component").toBeDefined();
    expect([...(fromDoc!.required ?? [])].sort()).toEqual([...((runJsonSchema().required as string[]) ?? [])].sort());
    expect(fromDoc!.required).toContain("controls");
  });
});
