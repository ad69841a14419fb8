/** Alert workflow, service log and mail administration operations. */
import { acknowledgeAlertSchema, listAlertsQuerySchema, resolveAlertSchema, serviceEventSchema, testMailSchema } from "@/lib/validations/alert";
import { idNotFound, type ApiOperation } from "../operation";
import { documentFields, z } from "../registry";
import { okSchema } from "../responses";
import { alertListItemSchema, alertSchema, outboxMessageSchema, serviceEventSchema as serviceEventResponse, testMailQueuedSchema } from "../responses-qa";

const serviceBody = documentFields(serviceEventSchema, {
  performedAt: { description: "When the work was done (ISO 8601 date-time)", type: "string", format: "date-time" },
  description: "What was done",
  parts: "Parts replaced, if any",
});
const alertAnswer = z.object({ alert: alertSchema });
const alertNotFound = idNotFound("Alert");

export const ALERT_OPERATIONS: ApiOperation[] = [
  {
    method: "get", path: "/api/alerts", tag: "Alerts", access: "viewFleet",
    summary: "Alerts the caller may see, most recently changed first",
    description: "Service engineers see the alerts of their assigned scanners. At most 500.",
    query: documentFields(listAlertsQuerySchema, {
      state: "open, acknowledged, resolved, or active (open or acknowledged)",
      cause: "What raised it: action or warning result, overdue test, or drift",
      scannerId: "Only this scanner's alerts",
    }),
    success: { status: 200, description: "Alerts", json: z.object({ alerts: z.array(alertListItemSchema) }) },
    errors: { 422: "A filter value is invalid" },
  },
  {
    method: "get", path: "/api/alerts/{id}", tag: "Alerts", access: "viewFleet",
    summary: "One alert with its service events",
    success: { status: 200, description: "The alert", json: alertAnswer },
    errors: { 404: alertNotFound },
  },
  {
    method: "post", path: "/api/alerts/{id}/acknowledge", tag: "Alerts", access: "acknowledgeAlerts",
    summary: "Take the alert (engineer or physicist)",
    description: "The body is optional.",
    body: { json: documentFields(acknowledgeAlertSchema, { note: "Comment, kept in the audit log" }), required: false },
    success: { status: 200, description: "The alert, acknowledged", json: alertAnswer },
    errors: { 404: alertNotFound, 409: "The alert is not open (already acknowledged or resolved)" },
  },
  {
    method: "post", path: "/api/alerts/{id}/service", tag: "Alerts", access: "logService",
    summary: "Log a service action against the alert",
    description: "An open alert becomes acknowledged.",
    body: { json: serviceBody },
    success: {
      status: 201, description: "Logged",
      json: z.object({ serviceEventId: z.number().int().positive(), alert: alertSchema }),
    },
    errors: { 404: alertNotFound, 409: "The alert is resolved: log the service on the scanner instead" },
  },
  {
    method: "post", path: "/api/alerts/{id}/resolve", tag: "Alerts", access: "resolveAlerts",
    summary: "Close the alert (physicist)",
    description: "Action and warning alerts need a passing re-test first; overdue and drift alerts can be closed with a note.",
    body: { json: documentFields(resolveAlertSchema, { note: "How it was closed, e.g. re-test passed after service" }) },
    success: { status: 200, description: "The alert, resolved", json: alertAnswer },
    errors: { 404: alertNotFound, 409: "Already resolved, or no passing re-test yet" },
  },
  {
    method: "get", path: "/api/scanners/{id}/service-events", tag: "Alerts", access: "viewFleet",
    summary: "The scanner's service log, newest first",
    success: { status: 200, description: "Service events", json: z.object({ serviceEvents: z.array(serviceEventResponse) }) },
    errors: { 404: idNotFound("Scanner") },
  },
  {
    method: "post", path: "/api/scanners/{id}/service-events", tag: "Alerts", access: "logService",
    summary: "Log a service action not tied to an alert",
    body: { json: serviceBody },
    success: { status: 201, description: "Logged", json: z.object({ id: z.number().int().positive() }) },
    errors: { 404: idNotFound("Scanner") },
  },
  {
    method: "get", path: "/api/admin/outbox", tag: "Mail", access: "viewOutbox",
    summary: "The latest 200 queued, sent and failed e-mails with attempts and last error",
    success: { status: 200, description: "Messages, newest first", json: z.object({ messages: z.array(outboxMessageSchema) }) },
  },
  {
    method: "post", path: "/api/admin/outbox/{id}/retry", tag: "Mail", access: "viewOutbox",
    summary: "Put a failed or waiting message back at the front of the queue",
    success: { status: 200, description: "Queued for the next send", json: okSchema },
    errors: { 404: "No pending or failed message with this id" },
  },
  {
    method: "post", path: "/api/admin/mail/test", tag: "Mail", access: "sendTestMail",
    summary: "Queue a test message to check the SMTP configuration",
    body: { json: documentFields(testMailSchema, { to: "Recipient address" }) },
    success: { status: 202, description: "Queued", json: testMailQueuedSchema },
  },
];
