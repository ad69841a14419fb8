import { toErrorResponse } from "@/lib/errors";
import { getOpenApiDocument } from "@/lib/openapi/document";

export const dynamic = "force-dynamic";

// GET /api/openapi.json – the OpenAPI 3.1 description of this API. No auth.
export function GET(): Response {
  try {
    return Response.json(getOpenApiDocument(), { headers: { "cache-control": "public, max-age=300" } });
  } catch (err) {
    return toErrorResponse(err);
  }
}
