/**
 * Back-off for outbox deliveries (e-mail alerts): exponential growth with a cap and "equal jitter" — half of the
 * delay fixed, half random — so retries from many messages spread out but never come back sooner than half the
 * nominal delay (exponential back-off with jitter as described in the AWS Architecture Blog, "Exponential Backoff
 * And Jitter", 2015 — from memory). The random source is injected so tests are deterministic.
 */
import { QaError, assertFinite } from "./qa-error";

/** Back-off parameters (Halfmax choices): nominal 1, 2, 4 … min, capped at 1 h; the 11 waits between 12 attempts add up to 3–6 h (363 min nominal). */
export const RETRY_POLICY = {
  baseDelayMs: 60_000,
  factor: 2,
  maxDelayMs: 3_600_000,
  maxAttempts: 12,
} as const;

/** Total delivery attempts before a message is marked failed. */
export const MAX_ATTEMPTS = RETRY_POLICY.maxAttempts;

/**
 * Delay in ms before the next attempt, after `attempt` failed attempts (1 = the first try failed).
 * Nominal delay d = min(maxDelayMs, baseDelayMs·factor^(attempt−1)); returns d/2 + u·d/2 with u = random() ∈ [0, 1),
 * rounded to whole ms. Throws QaError if attempt is not an integer ≥ 1 or random() returns a value outside [0, 1).
 */
export function nextAttemptDelayMs(attempt: number, random: () => number): number {
  if (!Number.isInteger(attempt) || attempt < 1) throw new QaError(`attempt must be an integer ≥ 1, got ${attempt}`);
  const u = random();
  assertFinite(u, "random()");
  if (u < 0 || u >= 1) throw new QaError(`random() must return a value in [0, 1), got ${u}`);
  // Exponent capped so the power cannot overflow for very large attempt counts.
  const exponent = Math.min(attempt - 1, 64);
  const nominal = Math.min(RETRY_POLICY.maxDelayMs, RETRY_POLICY.baseDelayMs * RETRY_POLICY.factor ** exponent);
  return Math.round(nominal / 2 + (u * nominal) / 2);
}

/** Time of the next attempt: `now` plus nextAttemptDelayMs(attempt, random). */
export function nextAttemptAt(now: Date, attempt: number, random: () => number): Date {
  return new Date(now.getTime() + nextAttemptDelayMs(attempt, random));
}

/** True once `attempts` delivery attempts have been made and the message should be marked failed. */
export function shouldGiveUp(attempts: number): boolean {
  if (!Number.isInteger(attempts) || attempts < 0) throw new QaError(`attempts must be an integer ≥ 0, got ${attempts}`);
  return attempts >= MAX_ATTEMPTS;
}
