import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { Validator } from "@seriousme/openapi-schema-validator";
import { describe, expect, it } from "vitest";
import { GET as getOpenApiJson } from "@/app/api/openapi.json/route";
import { buildOpenApiDocument, getOpenApiDocument, type OpenApiDocument } from "@/lib/openapi/document";
import { buildApiReference } from "@/lib/openapi/reference";
import { createScannerSchema } from "@/lib/validations/scanner";
import { createScanSchema, listScansQuerySchema, reanalyseSchema } from "@/lib/validations/scan";
import pkg from "@/package.json";

const API_DIR = path.resolve(__dirname, "../../app/api");
const HTTP_METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

type Json = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any -- walking a JSON document

/**
 * Route handlers under app/api, as "METHOD /path" (Next.js App Router conventions: a folder per segment, `[id]` a
 * dynamic segment, `(group)` not part of the URL; the next-auth catch-all `[...nextauth]` is left out).
 */
function routeHandlers(dir = API_DIR, segments: string[] = ["api"]): string[] {
  const found: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.isDirectory()) {
      if (entry.name.startsWith("[...") || entry.name.startsWith("[[...")) continue;
      const segment = /^\(.*\)$/.test(entry.name) ? null : entry.name.replace(/^\[(\w+)\]$/, "{$1}");
      found.push(...routeHandlers(path.join(dir, entry.name), segment ? [...segments, segment] : segments));
    } else if (entry.name === "route.ts") {
      const text = readFileSync(path.join(dir, entry.name), "utf8");
      const exported = new Set<string>();
      for (const m of text.matchAll(/export\s+(?:const|let|var|(?:async\s+)?function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) exported.add(m[1]!);
      for (const m of text.matchAll(/export\s*\{([^}]*)\}/g)) {
        for (const part of m[1]!.split(",")) {
          const name = part.trim().split(/\s+as\s+/).pop()!;
          if ((HTTP_METHODS as readonly string[]).includes(name)) exported.add(name);
        }
      }
      for (const method of exported) found.push(`${method} /${segments.join("/")}`);
    }
  }
  return found;
}

function documentedOperations(doc: OpenApiDocument): string[] {
  return Object.entries(doc.paths ?? {}).flatMap(([p, item]) =>
    HTTP_METHODS.filter((m) => (item as Json)[m.toLowerCase()]).map((m) => `${m} ${p}`),
  );
}

function operation(doc: OpenApiDocument, method: string, p: string): Json {
  const op = (doc.paths?.[p] as Json | undefined)?.[method];
  if (!op) throw new Error(`${method.toUpperCase()} ${p} is not in the document`);
  return op;
}

function component(doc: OpenApiDocument, name: string): Json {
  const schema = doc.components?.schemas?.[name] as Json | undefined;
  if (!schema) throw new Error(`components.schemas.${name} is missing`);
  return schema;
}

describe("OpenAPI document", () => {
  const doc = buildOpenApiDocument();

  it("buildOpenApiDocument() validates against the OpenAPI 3.1 schema and its $refs resolve", async () => {
    // Reference: the OpenAPI Initiative's published JSON Schema for OAS 3.1, applied by @seriousme/openapi-schema-validator.
    const validator = new Validator();
    const result = await validator.validate(structuredClone(doc) as unknown as Record<string, unknown>);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe("3.1");
    expect(() => validator.resolveRefs()).not.toThrow();

    // The same validator refuses a document without the required `info` object (OAS 3.1 §4.8.1), so the check above can fail.
    const { info: _info, ...withoutInfo } = structuredClone(doc);
    const broken = await new Validator().validate(withoutInfo as Record<string, unknown>);
    expect(broken.valid).toBe(false);
  });

  it("buildOpenApiDocument() names the API Halfmax API with the package.json version and declares both security schemes", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.info.title).toBe("Halfmax API");
    expect(doc.info.version).toBe(pkg.version);
    // Security schemes as the auth code accepts them: Bearer token header, next-auth session cookie (common practice).
    expect(doc.components?.securitySchemes).toMatchObject({
      bearerAuth: { type: "http", scheme: "bearer" },
      sessionCookie: { type: "apiKey", in: "cookie", name: "next-auth.session-token" },
    });
  });

  it("every exported handler under app/api is documented, and every documented operation has a handler", () => {
    // Reference: the route files themselves (Next.js App Router: route.ts exports one function per HTTP method).
    const handlers = routeHandlers().sort();
    expect(handlers).toContain("POST /api/scans");
    expect(handlers).toContain("GET /api/scans/{id}/image");
    expect(handlers.some((h) => h.includes("nextauth") || h.includes("/api/auth"))).toBe(false);
    expect(documentedOperations(doc).sort()).toEqual(handlers);
  });

  it("every operation has a tag, a summary, an operationId and a success response; protected ones list both schemes and 401", () => {
    const ids = new Set<string>();
    for (const [p, item] of Object.entries(doc.paths ?? {})) {
      for (const [method, op] of Object.entries(item as Json)) {
        const where = `${method.toUpperCase()} ${p}`;
        expect(op.tags?.length, where).toBe(1);
        expect(op.summary, where).toBeTruthy();
        expect(ids.has(op.operationId), `${where} operationId is unique`).toBe(false);
        ids.add(op.operationId);
        expect(Object.keys(op.responses).some((s) => s.startsWith("2")), where).toBe(true);
        if (op.security.length > 0) {
          expect(op.security, where).toEqual([{ bearerAuth: [] }, { sessionCookie: [] }]);
          expect(op.responses["401"]?.content?.["application/json"]?.schema, where).toEqual({ $ref: "#/components/schemas/Error" });
        }
        if (p.includes("{id}")) expect(op.responses["404"], `${where} answers 404 for an unknown id`).toBeDefined();
      }
    }
    // Public by design: health, this document, and the password links (the token in the body is the proof).
    const open = documentedOperations(doc).filter((o) => {
      const [m, p] = o.split(" ") as [string, string];
      return operation(doc, m.toLowerCase(), p).security.length === 0;
    });
    expect(open.sort()).toEqual(["GET /api/health", "GET /api/openapi.json", "POST /api/password/reset", "POST /api/password/set"]);
  });

  it("role-restricted operations answer 403 and any-role ones do not (lib/auth/roles PERMISSIONS)", () => {
    expect(operation(doc, "post", "/api/scans").responses["403"]).toBeDefined(); // uploadScans: admin, physicist
    expect(operation(doc, "delete", "/api/scanners/{id}").responses["403"]).toBeDefined(); // manageScanners: admin
    expect(operation(doc, "get", "/api/scanners").responses["403"]).toBeUndefined(); // viewFleet: every role
    expect(operation(doc, "get", "/api/me").responses["403"]).toBeUndefined(); // any signed-in user
    expect(operation(doc, "post", "/api/scans")["x-halfmax-roles"]).toEqual(["admin", "physicist"]);
  });

  it("POST /api/scans takes multipart/form-data with a required binary `file` and the fields of createScanSchema", () => {
    const body = operation(doc, "post", "/api/scans").requestBody;
    expect(body.required).toBe(true);
    expect(Object.keys(body.content)).toEqual(["multipart/form-data"]);
    const schema = body.content["multipart/form-data"].schema;
    // OAS 3.1 §4.8.14.3 (multipart, binary content): a string part with contentMediaType; `format: binary` kept for 3.0-era tools.
    expect(schema.properties.file).toMatchObject({ type: "string", format: "binary", contentMediaType: "application/octet-stream" });
    expect(schema.required).toEqual(expect.arrayContaining(["file", "scannerId"]));
    expect(Object.keys(schema.properties).sort()).toEqual(["file", ...Object.keys(createScanSchema.shape)].sort());
    // Form values are text: no `null` type may leak from the preprocess steps.
    for (const [name, prop] of Object.entries(schema.properties as Record<string, Json>)) {
      expect(JSON.stringify(prop.type), name).not.toContain("null");
    }
    expect(schema.properties.method.enum).toEqual(["point", "line", "edge", "disk", "auto"]);
    const errors = Object.keys(operation(doc, "post", "/api/scans").responses);
    expect(errors).toEqual(expect.arrayContaining(["201", "400", "401", "403", "404", "409", "413", "415", "422"]));
  });

  it("JSON request bodies and query parameters come from the handlers' zod schemas", () => {
    const scannerBody = operation(doc, "post", "/api/scanners").requestBody.content["application/json"].schema;
    expect(Object.keys(scannerBody.properties).sort()).toEqual(Object.keys(createScannerSchema.shape).sort());
    expect(scannerBody.required.sort()).toEqual(["modality", "name", "siteId"]);
    expect(scannerBody.properties.name).toMatchObject({ minLength: 1, maxLength: 120 });

    const reanalyse = operation(doc, "post", "/api/scans/{id}/analyses").requestBody.content["application/json"].schema;
    expect(Object.keys(reanalyse.properties).sort()).toEqual(Object.keys(reanalyseSchema.shape).sort());

    const params = operation(doc, "get", "/api/scans").parameters as Json[];
    expect(params.map((p) => p.name).sort()).toEqual(Object.keys(listScansQuerySchema.shape).sort());
    expect(params.every((p) => p.in === "query" && p.required === false)).toBe(true);
    expect(params.find((p) => p.name === "pageSize")?.schema).toMatchObject({ minimum: 1, maximum: 200, default: 50 });
  });

  it("GET /api/scans answers a page with scans and total", () => {
    const ok = operation(doc, "get", "/api/scans").responses["200"].content["application/json"].schema;
    expect(ok).toEqual({ $ref: "#/components/schemas/ScanPage" });
    const page = component(doc, "ScanPage");
    expect(page.required.sort()).toEqual(["page", "pageSize", "scans", "total"]);
    expect(page.properties.scans.items).toEqual({ $ref: "#/components/schemas/ScanListItem" });
  });

  it("AnalysisResult has exactly the keys of the public analysis JSON contract, with units in the descriptions", () => {
    // Reference: the public analysis JSON contract (method, pixelSpacingMm [row, col], widths in mm, frequencies in cycles/mm).
    const schema = component(doc, "AnalysisResult");
    const contract = [
      "method", "pixelSpacingMm", "fwhmMm", "fwtmMm", "fwhmXMm", "fwhmYMm", "fwtmXMm", "fwtmYMm",
      "mtf50", "mtf10", "nyquist", "mtfAtNyquist", "edgeAngleDeg", "mtf", "warnings", "version",
    ];
    const optional = ["fwhmXMm", "fwhmYMm", "fwtmXMm", "fwtmYMm", "edgeAngleDeg"];
    expect(Object.keys(schema.properties).sort()).toEqual([...contract].sort());
    expect([...schema.required].sort()).toEqual(contract.filter((k) => !optional.includes(k)).sort());
    expect(schema.properties.pixelSpacingMm).toMatchObject({ type: "array", prefixItems: [{ type: "number" }, { type: "number" }] });
    expect(schema.properties.pixelSpacingMm.description).toMatch(/row.*col/i);
    expect(schema.properties.fwhmMm.description).toMatch(/mm/);
    expect(schema.properties.mtf50.description).toMatch(/cycles\/mm/);
    const mtf = component(doc, "MtfCurve");
    expect(Object.keys(mtf.properties).sort()).toEqual(["frequency", "value"]);
    expect(mtf.properties.frequency.description).toMatch(/cycles\/mm/);

    // The scan response carries it: Scan.analysis → ScanAnalysis (or null) → allOf AnalysisResult.
    expect(component(doc, "Scan").properties.analysis).toEqual({ anyOf: [{ $ref: "#/components/schemas/ScanAnalysis" }, { type: "null" }] });
    expect(component(doc, "ScanAnalysis").allOf[0]).toEqual({ $ref: "#/components/schemas/AnalysisResult" });
  });

  it("the binary endpoints describe their media types and headers", () => {
    const file = operation(doc, "get", "/api/scans/{id}/file").responses["200"];
    expect(Object.keys(file.content)).toEqual(["application/dicom", "image/png", "image/tiff", "application/octet-stream"]);
    expect(file.headers).toHaveProperty("x-content-sha256");
    const image = operation(doc, "get", "/api/scans/{id}/image").responses["200"];
    expect(image.content["application/octet-stream"].schema).toMatchObject({ type: "string", format: "binary" });
    expect(Object.keys(image.headers).sort()).toEqual(["x-height", "x-max", "x-min", "x-scale", "x-width"]);
  });

  it("buildApiReference(doc) lists every operation under its tag with its fields", () => {
    const sections = buildApiReference(doc);
    expect(sections.flatMap((s) => s.operations).length).toBe(documentedOperations(doc).length);
    const upload = sections.find((s) => s.tag === "Scans")!.operations.find((o) => o.method === "POST" && o.path === "/api/scans")!;
    expect(upload.body?.mediaType).toBe("multipart/form-data");
    expect(upload.body?.fields.find((f) => f.name === "file")).toMatchObject({ type: "file", required: true });
    expect(upload.body?.fields.find((f) => f.name === "method")?.description).toContain('default "auto"');
    const reanalyse = sections.find((s) => s.tag === "Scans")!.operations.find((o) => o.path === "/api/scans/{id}/analyses")!;
    expect(reanalyse.parameters).toEqual([expect.objectContaining({ name: "id", location: "path", type: "integer", required: true })]);
    expect(reanalyse.body?.fields.map((f) => f.name)).toContain("roi.width");
    const putTests = sections.find((s) => s.tag === "QA")!.operations.find((o) => o.method === "PUT" && o.path === "/api/scanners/{id}/tests")!;
    expect(putTests.body?.fields.find((f) => f.name === "tests[].frequency")).toMatchObject({ type: "daily | weekly | monthly | quarterly | annual", required: true });
  });
});

describe("GET /api/openapi.json", () => {
  it("GET() answers 200 application/json with the cached document, no auth needed", async () => {
    const res = getOpenApiJson();
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^application\/json/);
    const body = (await res.json()) as Json;
    expect(body.openapi).toBe("3.1.0");
    expect(body).toEqual(JSON.parse(JSON.stringify(getOpenApiDocument())));
    expect(getOpenApiDocument()).toBe(getOpenApiDocument());
  });
});
