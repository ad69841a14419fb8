/**
 * Builds the OpenAPI 3.1 document of the HTTP API from the operation table (routes.ts), the handlers' zod request
 * schemas and the response schemas (responses.ts). Error responses are derived here, once, from each operation's
 * access, path and body, so every route lists 401/403/404/400/422 the same way.
 */
import { OpenAPIRegistry, OpenApiGeneratorV31, type ResponseConfig, type RouteConfig } from "@asteasolutions/zod-to-openapi";
import { ROLES, type Role } from "@/db/schema";
import { PERMISSIONS } from "@/lib/auth/roles";
import { APP_VERSION } from "@/lib/version";
import {
  ERROR_MEANINGS,
  errorCodesFor,
  pathIdSchema,
  SECURITY_SCHEMES,
  VALIDATION_FAILED_MEANING,
  z,
  type ErrorStatus,
  type SecuritySchemeName,
} from "./registry";
import { errorBodySchema } from "./responses";
import { API_OPERATIONS, API_TAGS, type ApiAccess, type ApiOperation } from "./routes";

export type OpenApiDocument = ReturnType<OpenApiGeneratorV31["generateDocument"]>;

/** Roles that may call an operation (every role for "signed-in", none needed for "public"). */
export function rolesFor(access: ApiAccess): readonly Role[] {
  if (access === "public") return [];
  if (access === "signed-in") return ROLES;
  return PERMISSIONS[access];
}

function accessSentence(access: ApiAccess): string {
  if (access === "public") return "Access: public, no authentication.";
  if (access === "signed-in") return "Access: any signed-in user (session cookie or API token).";
  const roles = rolesFor(access);
  if (roles.length === ROLES.length) return "Access: any signed-in user.";
  return `Access: role ${roles.join(" or ")} (permission ${access}).`;
}

/** Path parameter names in order, e.g. "/api/scans/{id}/file" → ["id"]. */
export function pathParameterNames(path: string): string[] {
  return [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);
}

/** Stable operation id from method and path: "get /api/scans/{id}/file" → "getScansByIdFile". */
export function operationIdFor(method: string, path: string): string {
  const words = path
    .replace(/^\/api\//, "")
    .split("/")
    .map((segment) => {
      const param = /^\{(\w+)\}$/.exec(segment);
      const word = param ? `by-${param[1]}` : segment;
      return word.replace(/[^A-Za-z0-9]+(.)?/g, (_, c: string | undefined) => (c ? c.toUpperCase() : ""));
    });
  return method + words.map((w) => w.charAt(0).toUpperCase() + w.slice(1)).join("");
}

/**
 * Error statuses an operation can answer with, and what they mean for it: 401 unless public, 403 when not every
 * role may call it, 404 with a path id, 400 and 422 with a JSON body (422 with a multipart body), then the
 * operation's own `errors` (a validated query declares its 422 there: not every handler validates its query).
 */
export function errorResponsesFor(op: ApiOperation): Map<ErrorStatus, { description: string; json: z.ZodType }> {
  const out = new Map<ErrorStatus, { description: string; json: z.ZodType }>();
  const add = (status: ErrorStatus, description: string = ERROR_MEANINGS[status]) => out.set(status, { description, json: errorBodySchema });
  if (op.access !== "public") add(401);
  if (op.access !== "public" && rolesFor(op.access).length < ROLES.length) add(403);
  if (pathParameterNames(op.path).length > 0) add(404);
  if (op.body && "json" in op.body) add(400, "The body is not JSON");
  if (op.body) add(422, VALIDATION_FAILED_MEANING);
  for (const [key, value] of Object.entries(op.errors ?? {})) {
    const status = Number(key) as ErrorStatus;
    if (typeof value === "string") add(status, value);
    else if (value) out.set(status, value);
  }
  return new Map([...out.entries()].sort(([a], [b]) => a - b));
}

function routeConfig(op: ApiOperation): RouteConfig {
  const params = pathParameterNames(op.path);
  const security = op.access === "public" ? [] : (Object.keys(SECURITY_SCHEMES) as SecuritySchemeName[]).map((name) => ({ [name]: [] }));
  const responses: Record<string, ResponseConfig> = {};
  const { success } = op;
  responses[String(success.status)] = {
    description: success.description,
    headers: success.headers
      ? Object.fromEntries(Object.entries(success.headers).map(([name, description]) => [name, { description, schema: { type: "string" } }]))
      : undefined,
    content: success.json
      ? { "application/json": { schema: success.json } }
      : Object.fromEntries(
          (success.raw?.mediaTypes ?? []).map((type) => [type, { schema: success.raw?.text ? { type: "string" } : { type: "string", format: "binary", contentMediaType: type } }]),
        ),
  };
  for (const [status, error] of errorResponsesFor(op)) {
    // Name the code when the status has only one (422 has two; the description says which applies).
    const codes = error.json === errorBodySchema ? errorCodesFor(status) : [];
    responses[String(status)] = {
      description: codes.length === 1 ? `${error.description} — code ${codes[0]}` : error.description,
      content: { "application/json": { schema: error.json } },
    };
  }
  return {
    method: op.method,
    path: op.path,
    operationId: operationIdFor(op.method, op.path),
    tags: [op.tag],
    summary: op.summary,
    description: [op.description, accessSentence(op.access)].filter(Boolean).join("\n\n"),
    security,
    "x-halfmax-roles": [...rolesFor(op.access)],
    request: {
      params: params.length ? z.object(Object.fromEntries(params.map((name) => [name, pathIdSchema]))) : undefined,
      query: op.query,
      body: op.body
        ? "json" in op.body
          ? { required: op.body.required ?? true, content: { "application/json": { schema: op.body.json } } }
          : { required: true, content: { "multipart/form-data": { schema: op.body.multipart } } }
        : undefined,
    },
    responses,
  };
}

const API_DESCRIPTION = [
  "HTTP API of Halfmax, the spatial-resolution QA workbench (PSF/LSF/ESF, FWHM/FWTM, MTF). Widths are in mm, spatial frequencies in cycles/mm.",
  "Authenticate with a personal API token (`Authorization: Bearer <token>`; create one under Account & tokens, or run `npm run --silent token -- <email>`) or with the browser session cookie. The token acts with its owner's role.",
  "Errors are JSON `{ error, code, issues? }`; each `code` maps to one HTTP status. 422 `validation_failed` lists the invalid fields in `issues`.",
].join("\n\n");

/** Form fields and query values travel as text, so the `null` a preprocess or coerce step admits cannot occur on the wire. */
function dropNullFromTextInputs(doc: OpenApiDocument): void {
  const strip = (schema: unknown) => {
    if (!schema || typeof schema !== "object") return;
    const s = schema as { type?: unknown; enum?: unknown[] };
    if (Array.isArray(s.type)) {
      const types = s.type.filter((t) => t !== "null");
      s.type = types.length === 1 ? types[0] : types;
    }
    if (Array.isArray(s.enum)) s.enum = s.enum.filter((v) => v !== null);
  };
  for (const item of Object.values(doc.paths ?? {})) {
    for (const method of ["get", "post", "put", "patch", "delete"] as const) {
      const operation = item[method];
      if (!operation) continue;
      for (const p of operation.parameters ?? []) if ("in" in p && p.in === "query") strip(p.schema);
      const body = operation.requestBody;
      const form = body && "content" in body ? body.content["multipart/form-data"]?.schema : undefined;
      if (form && "properties" in form) for (const prop of Object.values(form.properties ?? {})) strip(prop);
    }
  }
}

/** Builds a fresh OpenAPI 3.1 document for the given operations (default: every operation of the API). */
export function buildOpenApiDocument(operations: readonly ApiOperation[] = API_OPERATIONS): OpenApiDocument {
  const registry = new OpenAPIRegistry();
  for (const [name, scheme] of Object.entries(SECURITY_SCHEMES)) registry.registerComponent("securitySchemes", name, scheme);
  registry.register("Error", errorBodySchema);
  for (const op of operations) registry.registerPath(routeConfig(op));
  const doc = new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: "3.1.0",
    info: { title: "Halfmax API", version: APP_VERSION, description: API_DESCRIPTION },
    tags: API_TAGS.map((t) => ({ ...t })),
  });
  dropNullFromTextInputs(doc);
  return doc;
}

let cached: OpenApiDocument | null = null;

/** The API's document, built on first use and kept in memory (the schemas cannot change while the server runs). */
export function getOpenApiDocument(): OpenApiDocument {
  cached ??= buildOpenApiDocument();
  return cached;
}
