/**
 * A readable view of the OpenAPI document for the /api-docs page: operations grouped by tag, with their parameters,
 * request fields and responses as plain rows. Works on the generated document only, so the page can never show
 * something the document does not say.
 */
import type { OpenApiDocument } from "./document";

/** A JSON Schema (OpenAPI 3.1 dialect) as far as this view reads it. */
interface Schema {
  $ref?: string;
  type?: string | string[];
  format?: string;
  enum?: unknown[];
  const?: unknown;
  items?: Schema;
  prefixItems?: Schema[];
  properties?: Record<string, Schema>;
  additionalProperties?: Schema | boolean;
  required?: string[];
  anyOf?: Schema[];
  oneOf?: Schema[];
  allOf?: Schema[];
  description?: string;
  default?: unknown;
  examples?: unknown[];
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  maxItems?: number;
}

export interface ReferenceField {
  /** Field name; nested fields are dotted ("roi.width"). */
  name: string;
  /** For parameters: where it goes. */
  location?: "path" | "query" | "header" | "cookie";
  type: string;
  required: boolean;
  /** Description followed by default, bounds and an example, when the schema has them. */
  description: string;
}

export interface ReferenceResponse {
  status: string;
  description: string;
  mediaTypes: string[];
  /** Short shape of the body, e.g. "Scan" or "{ scanners: Scanner[] }"; empty for binary or no body. */
  shape: string;
}

export interface ReferenceOperation {
  /** operationId, usable as an HTML anchor. */
  id: string;
  method: string;
  path: string;
  summary: string;
  /** Paragraphs of the description. */
  description: string[];
  isPublic: boolean;
  parameters: ReferenceField[];
  body: { mediaType: string; required: boolean; fields: ReferenceField[] } | null;
  responses: ReferenceResponse[];
}

export interface ReferenceSection {
  tag: string;
  description: string;
  operations: ReferenceOperation[];
}

const METHODS = ["get", "post", "put", "patch", "delete"] as const;

/** Resolves a local `#/components/schemas/Name` reference; other schemas are returned as they are. */
function resolve(schema: Schema | undefined, doc: OpenApiDocument): Schema {
  if (!schema) return {};
  if (!schema.$ref) return schema;
  const name = refName(schema.$ref);
  return (doc.components?.schemas?.[name] as Schema | undefined) ?? {};
}

function refName(ref: string): string {
  return ref.slice(ref.lastIndexOf("/") + 1);
}

/** A short type label: "integer", "string | null", "point | line", "Scanner[]", "[number, number]", "file". */
export function typeLabel(schema: Schema | undefined): string {
  if (!schema) return "any";
  if (schema.$ref) return refName(schema.$ref);
  if (schema.anyOf ?? schema.oneOf) return (schema.anyOf ?? schema.oneOf)!.map(typeLabel).join(" | ");
  if (schema.allOf) return schema.allOf.map(typeLabel).join(" & ");
  if (schema.const !== undefined) return JSON.stringify(schema.const);
  if (schema.enum) return schema.enum.map((v) => (typeof v === "string" ? v : JSON.stringify(v))).join(" | ");
  const types = Array.isArray(schema.type) ? schema.type : schema.type ? [schema.type] : [];
  if (types.length === 0) return schema.properties ? "object" : "any";
  return types
    .map((t) => {
      if (t === "array") return schema.prefixItems ? `[${schema.prefixItems.map(typeLabel).join(", ")}]` : `${typeLabel(schema.items)}[]`;
      if (t === "string" && schema.format === "binary") return "file";
      if (t === "string" && schema.format) return schema.format;
      return t;
    })
    .join(" | ");
}

/** Description plus the schema's default, bounds and first example, as one sentence-ish line. */
function describe(schema: Schema, extra?: string): string {
  const facts: string[] = [];
  const text = extra ?? schema.description;
  if (text) facts.push(text.replace(/\.$/, ""));
  const lower = schema.exclusiveMinimum !== undefined ? `> ${schema.exclusiveMinimum}` : schema.minimum !== undefined ? `≥ ${schema.minimum}` : null;
  const upper = schema.exclusiveMaximum !== undefined ? `< ${schema.exclusiveMaximum}` : schema.maximum !== undefined ? `≤ ${schema.maximum}` : null;
  if (lower || upper) facts.push([lower, upper].filter(Boolean).join(", "));
  if (schema.maxLength !== undefined) facts.push(schema.minLength ? `${schema.minLength}–${schema.maxLength} characters` : `at most ${schema.maxLength} characters`);
  else if (schema.minLength) facts.push(`at least ${schema.minLength} characters`);
  if (schema.maxItems !== undefined) facts.push(`at most ${schema.maxItems} items`);
  if (schema.default !== undefined) facts.push(`default ${JSON.stringify(schema.default)}`);
  if (schema.examples?.length) facts.push(`e.g. ${JSON.stringify(schema.examples[0])}`);
  return facts.join("; ");
}

/** The inline object inside `T | null`, if the schema is one. */
function objectPart(schema: Schema): Schema | null {
  if (schema.properties) return schema;
  for (const s of schema.anyOf ?? schema.oneOf ?? []) if (s.properties) return s;
  return null;
}

/**
 * Rows for an object schema's properties; inline sub-objects and arrays of them get rows too, one level deep
 * ("roi.width", "tests[].name").
 * `$ref` schemas are resolved at the top, and listed by name below it.
 */
export function fieldsOf(schema: Schema | undefined, doc: OpenApiDocument, prefix = "", depth = 0): ReferenceField[] {
  const resolved = resolve(schema, doc);
  const parts = resolved.allOf ? resolved.allOf.map((s) => resolve(s, doc)) : [resolved];
  const rows: ReferenceField[] = [];
  for (const part of parts) {
    const required = new Set(part.required ?? []);
    for (const [name, prop] of Object.entries(part.properties ?? {})) {
      rows.push({ name: prefix + name, type: typeLabel(prop), required: required.has(name), description: describe(prop) });
      const inner = objectPart(prop);
      const item = prop.items && objectPart(prop.items);
      if (inner && depth < 1) rows.push(...fieldsOf(inner, doc, `${prefix}${name}.`, depth + 1));
      else if (item && depth < 1) rows.push(...fieldsOf(item, doc, `${prefix}${name}[].`, depth + 1));
    }
  }
  return rows;
}

/** "Scan", "{ scanners: Scanner[] }", "Ok" … */
function shapeOf(schema: Schema | undefined): string {
  if (!schema) return "";
  if (schema.$ref || !schema.properties) return typeLabel(schema);
  const entries = Object.entries(schema.properties).map(([k, v]) => `${k}: ${typeLabel(v)}`);
  return `{ ${entries.join(", ")} }`;
}

interface Parameter { name: string; in: "path" | "query" | "header" | "cookie"; required?: boolean; description?: string; schema?: Schema }
interface MediaType { schema?: Schema }
interface Operation {
  operationId?: string;
  tags?: string[];
  summary?: string;
  description?: string;
  security?: unknown[];
  parameters?: Parameter[];
  requestBody?: { required?: boolean; content: Record<string, MediaType> };
  responses?: Record<string, { description?: string; content?: Record<string, MediaType> }>;
}

function toOperation(method: string, path: string, op: Operation, doc: OpenApiDocument): ReferenceOperation {
  const [mediaType, media] = Object.entries(op.requestBody?.content ?? {})[0] ?? [];
  return {
    id: op.operationId ?? `${method}-${path}`,
    method: method.toUpperCase(),
    path,
    summary: op.summary ?? "",
    description: (op.description ?? "").split(/\n{2,}/).filter(Boolean),
    isPublic: Array.isArray(op.security) && op.security.length === 0,
    parameters: (op.parameters ?? []).map((p) => ({
      name: p.name,
      location: p.in,
      type: typeLabel(p.schema),
      required: Boolean(p.required),
      description: describe(p.schema ?? {}, p.description),
    })),
    body: mediaType ? { mediaType, required: Boolean(op.requestBody?.required), fields: fieldsOf(media?.schema, doc) } : null,
    responses: Object.entries(op.responses ?? {}).map(([status, r]) => {
      const content = r.content ?? {};
      const json = content["application/json"];
      return { status, description: r.description ?? "", mediaTypes: Object.keys(content), shape: json ? shapeOf(json.schema) : "" };
    }),
  };
}

/** Operations of the document grouped by tag, in the document's tag order (untagged ones last, under "Other"). */
export function buildApiReference(doc: OpenApiDocument): ReferenceSection[] {
  const sections = new Map<string, ReferenceSection>();
  for (const t of doc.tags ?? []) sections.set(t.name, { tag: t.name, description: t.description ?? "", operations: [] });
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item[method] as Operation | undefined;
      if (!op) continue;
      const tag = op.tags?.[0] ?? "Other";
      if (!sections.has(tag)) sections.set(tag, { tag, description: "", operations: [] });
      sections.get(tag)!.operations.push(toOperation(method, path, op, doc));
    }
  }
  return [...sections.values()].filter((s) => s.operations.length > 0);
}
