/**
 * Every operation of the HTTP API. Adding a route handler under app/api = adding one entry to the array of its area
 * in operations/*.ts (tests/api/openapi.test.ts fails until every exported handler has its entry); a new area is one
 * more spread below.
 *
 * Request schemas are the handlers' own (lib/validations), with documentation attached by documentFields();
 * the usual error responses are derived from each entry's access, path and body (document.ts).
 */
import type { ApiOperation } from "./operation";
import { ACCOUNT_OPERATIONS } from "./operations/account";
import { ALERT_OPERATIONS } from "./operations/alerts";
import { FLEET_OPERATIONS } from "./operations/fleet";
import { QA_OPERATIONS } from "./operations/qa";
import { SCAN_OPERATIONS } from "./operations/scans";

export { API_TAGS, type ApiAccess, type ApiOperation, type ApiSuccess, type ApiTag } from "./operation";

export const API_OPERATIONS: readonly ApiOperation[] = [
  ...SCAN_OPERATIONS,
  ...FLEET_OPERATIONS,
  ...QA_OPERATIONS,
  ...ALERT_OPERATIONS,
  ...ACCOUNT_OPERATIONS,
];
