import { z } from "zod";
import { ALERT_CAUSES, ALERT_STATES } from "@/db/schema";

export const listAlertsQuerySchema = z.object({
  state: z.enum([...ALERT_STATES, "active"]).optional(),
  cause: z.enum(ALERT_CAUSES).optional(),
  scannerId: z.coerce.number().int().positive().optional(),
});

export const acknowledgeAlertSchema = z.object({ note: z.string().trim().max(1000).optional() });

export const serviceEventSchema = z.object({
  performedAt: z.coerce.date({ message: "performedAt must be a date and time" }),
  description: z.string().trim().min(3, { message: "Describe what was done" }).max(4000),
  parts: z.string().trim().max(1000).default(""),
});
export type ServiceEventInput = z.infer<typeof serviceEventSchema>;

export const resolveAlertSchema = z.object({
  note: z.string().trim().min(3, { message: "Say how the alert was closed (e.g. re-test passed after service)" }).max(2000),
});

export const testMailSchema = z.object({ to: z.string().trim().email({ message: "to must be an e-mail address" }) });
