// The OpenAPI document: every route handler file under app/api/v1 is described (and nothing else), and
// the document has the structure OpenAPI 3.1 requires (OpenAPI Specification 3.1.0, §4.8: openapi, info
// with title and version, paths whose operations each have responses with a description; every $ref
// resolves inside the document). Section numbers from memory.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, test } from "vitest";
import { openApiDocument } from "@/src/api/openapi";

const ROUTES_DIRECTORY = path.resolve("app/api/v1");

/** Every route.ts under app/api/v1 as [OpenAPI path, method] pairs, read from its exports. */
function routeFileOperations(): [string, string][] {
  const files = readdirSync(ROUTES_DIRECTORY, { recursive: true, encoding: "utf8" }).filter((file) => path.basename(file) === "route.ts");
  return files.flatMap((file) => {
    const routePath = `/api/v1/${path.dirname(file)}`.replace(/\/\.$/, "").replace(/\[(\w+)\]/g, "{$1}");
    const source = readFileSync(path.join(ROUTES_DIRECTORY, file), "utf8");
    const methods = [...source.matchAll(/export const (GET|POST|PUT|PATCH|DELETE) =/g)].map((match) => (match[1] ?? "").toLowerCase());
    return methods.map((method): [string, string] => [routePath, method]);
  });
}

/** Every `$ref` value anywhere in a JSON value. */
function references(value: unknown): string[] {
  if (Array.isArray(value)) return value.flatMap(references);
  if (value === null || typeof value !== "object") return [];
  return Object.entries(value).flatMap(([key, inner]) => (key === "$ref" && typeof inner === "string" ? [inner] : references(inner)));
}

function resolve(document: unknown, reference: string): unknown {
  return reference
    .replace(/^#\//, "")
    .split("/")
    .reduce<unknown>((node, part) => (node !== null && typeof node === "object" ? (node as Record<string, unknown>)[part] : undefined), document);
}

describe("the OpenAPI document", () => {
  const document = JSON.parse(JSON.stringify(openApiDocument())) as {
    openapi: string;
    info: { title: string; version: string };
    paths: Record<string, Record<string, { responses: Record<string, { description: string; content?: unknown }>; parameters?: { name: string; in: string }[] }>>;
    components: { schemas: Record<string, unknown> };
  };

  test("describes exactly the route handlers under app/api/v1", () => {
    const fromFiles = routeFileOperations()
      .map(([routePath, method]) => `${method} ${routePath}`)
      .sort();
    const fromDocument = Object.entries(document.paths)
      .flatMap(([routePath, item]) => Object.keys(item).map((method) => `${method} ${routePath}`))
      .sort();
    // Guards against a file walk that finds nothing: the fourteen operations of the API today.
    expect(fromFiles.length).toBe(14);
    expect(fromDocument).toEqual(fromFiles);
  });

  test("has the structure OpenAPI 3.1 requires", () => {
    expect(document.openapi).toBe("3.1.0");
    expect(document.info.title).toBe("Assignable API");
    expect(document.info.version).toMatch(/^\d+\.\d+\.\d+$/);
    for (const [routePath, item] of Object.entries(document.paths)) {
      expect(routePath.startsWith("/api/v1/")).toBe(true);
      const pathParameters = [...routePath.matchAll(/\{(\w+)\}/g)].map((match) => match[1]);
      for (const operation of Object.values(item)) {
        expect(Object.keys(operation.responses).length).toBeGreaterThan(0);
        for (const response of Object.values(operation.responses)) expect(response.description.length).toBeGreaterThan(0);
        // Every {parameter} in the path is declared as a path parameter (OpenAPI 3.1 §4.8.12.1).
        const declared = (operation.parameters ?? []).filter((parameter) => parameter.in === "path").map((parameter) => parameter.name);
        expect(declared.sort()).toEqual(pathParameters.sort());
      }
    }
  });

  test("every $ref resolves to a schema in components", () => {
    const all = references(document);
    expect(all.length).toBeGreaterThan(10);
    for (const reference of all) {
      expect(reference.startsWith("#/components/schemas/"), reference).toBe(true);
      expect(resolve(document, reference), reference).toBeTypeOf("object");
    }
    expect(Object.keys(document.components.schemas)).toEqual(
      expect.arrayContaining(["Error", "Characteristic", "SubgroupsPost", "SubgroupsPostAnswer", "Signal", "ProcessEventInput", "ProcessEvent", "ImportOptions"]),
    );
  });

  test("the answers of the subgroup post name the statuses the wrapper produces", () => {
    const responses = document.paths["/api/v1/characteristics/{id}/subgroups"]?.post?.responses ?? {};
    expect(Object.keys(responses).sort()).toEqual(["200", "201", "400", "403", "404", "409", "413", "415", "422", "500", "503"]);
    // 200 (a replay that stored nothing) answers the same shape as 201.
    expect(responses["200"]).toMatchObject({ content: responses["201"]!.content });
  });

  test("the subgroup post shows the caller's key and the outcome of each subgroup", () => {
    const post = document.components.schemas.SubgroupsPost as { properties: { subgroups: { items: { properties: Record<string, unknown> } } } };
    expect(post.properties.subgroups.items.properties.key).toMatchObject({ type: "string", minLength: 1, maxLength: 100 });
    const answer = document.components.schemas.SubgroupsPostAnswer as { properties: { outcomes: { items: { properties: Record<string, unknown> } } } };
    expect(answer.properties.outcomes.items.properties.status).toMatchObject({ enum: ["stored", "already-present"] });
  });
});
