import { z } from "zod";
import { FREQUENCIES, METHODS } from "@/db/schema";
import { METRIC_KEYS } from "@/lib/qa/metrics";

const metricEnum = z.enum(METRIC_KEYS as unknown as [string, ...string[]], { message: `metric must be one of ${METRIC_KEYS.join(", ")}` });

/** A routine test of a scanner and its schedule (PUT /api/scanners/{id}/tests). */
export const qaTestSchema = z.object({
  id: z.number().int().positive().optional(),
  name: z.string().trim().min(1, { message: "Name the test" }).max(120),
  method: z.enum(METHODS, { message: "method must be point, line, edge or disk" }),
  phantom: z.string().trim().max(200).default(""),
  protocol: z.string().trim().max(2000).default(""),
  frequency: z.enum(FREQUENCIES, { message: `frequency must be one of ${FREQUENCIES.join(", ")}` }),
  active: z.boolean().default(true),
});
export type QaTestInput = z.infer<typeof qaTestSchema>;
export const putTestsSchema = z.object({ tests: z.array(qaTestSchema).max(20) });

/** POST /api/scanners/{id}/baselines: a new baseline from N chosen results; the previous one stays in history. */
export const createBaselineSchema = z.object({
  testId: z.number().int().positive({ message: "Choose the test" }),
  scanIds: z.array(z.number().int().positive()).min(1, { message: "Select at least one result" }).max(200),
  reason: z.string().trim().min(3, { message: "Say why (e.g. acceptance test, after tube replacement)" }).max(1000),
});
export type CreateBaselineInput = z.infer<typeof createBaselineSchema>;

export const toleranceSchema = z
  .object({
    testId: z.number().int().positive(),
    metric: metricEnum,
    mode: z.enum(["relative", "absolute"]),
    warning: z.number().finite(),
    action: z.number().finite(),
    source: z.string().trim().min(1, { message: "Give the source of the levels, or 'local decision'" }).max(255),
  })
  .refine((t) => t.mode !== "relative" || (t.warning >= 0 && t.action >= t.warning), {
    message: "Relative levels are percentages ≥ 0 with the action level at or beyond the warning level",
    path: ["action"],
  });
export type ToleranceInput = z.infer<typeof toleranceSchema>;
export const putTolerancesSchema = z.object({ tolerances: z.array(toleranceSchema).min(1).max(50) });

export const trendQuerySchema = z.object({
  metric: metricEnum,
  testId: z.coerce.number().int().positive().optional(),
  from: z.coerce.date({ message: "from must be a date (YYYY-MM-DD)" }).optional(),
  to: z.coerce.date({ message: "to must be a date (YYYY-MM-DD)" }).optional(),
});
export type TrendQuery = z.infer<typeof trendQuerySchema>;

export const reportQuerySchema = z.object({
  from: z.coerce.date({ message: "from must be a date (YYYY-MM-DD)" }).optional(),
  to: z.coerce.date({ message: "to must be a date (YYYY-MM-DD)" }).optional(),
});
