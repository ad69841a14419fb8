import { describe, expect, it } from "vitest";
import { MAX_ATTEMPTS, RETRY_POLICY, nextAttemptAt, nextAttemptDelayMs, shouldGiveUp } from "@/lib/qa/retry";
import { QaError } from "@/lib/qa/qa-error";
import { createRandom } from "@/lib/phantoms/random";
import { expectClose } from "../helpers/expect-close";

// Reference: capped exponential back-off with "equal jitter" (half fixed, half uniform), as described in the AWS
// Architecture Blog "Exponential Backoff And Jitter" (2015, from memory): d = min(cap, base·2^(n−1)),
// delay = d/2 + U·d/2 with U ~ uniform[0, 1).
const nominal = (attempt: number) => Math.min(RETRY_POLICY.maxDelayMs, RETRY_POLICY.baseDelayMs * 2 ** (attempt - 1));

describe("nextAttemptDelayMs", () => {
  it("nextAttemptDelayMs(attempt, seeded random) equals d/2 + U·d/2 for the same seeded U", () => {
    const a = createRandom(2024);
    const b = createRandom(2024);
    for (let attempt = 1; attempt <= 15; attempt++) {
      const u = b.uniform();
      expect(nextAttemptDelayMs(attempt, a.uniform)).toBe(Math.round(nominal(attempt) / 2 + (u * nominal(attempt)) / 2));
    }
  });

  it("nextAttemptDelayMs doubles the nominal delay up to the cap", () => {
    // random = 0 gives exactly d/2: 30 s, 60 s, 120 s, … with d capped at 1 h from attempt 7 (60 s·2^6 = 64 min > 60 min).
    const lows = Array.from({ length: 9 }, (_, i) => nextAttemptDelayMs(i + 1, () => 0));
    expect(lows).toEqual([30_000, 60_000, 120_000, 240_000, 480_000, 960_000, 1_800_000, 1_800_000, 1_800_000]);
    expect(nextAttemptDelayMs(1000, () => 0.999999)).toBeLessThanOrEqual(RETRY_POLICY.maxDelayMs);
  });

  it("nextAttemptDelayMs stays within [d/2, d] and averages 3d/4 over seeded draws", () => {
    // Mean of d/2 + U·d/2 is 3d/4 because E[U] = 1/2 (uniform distribution); SD of the mean over 2000 draws ≈ 0.3 %.
    const rng = createRandom(11);
    const d = nominal(3);
    let sum = 0;
    for (let i = 0; i < 2000; i++) {
      const delay = nextAttemptDelayMs(3, rng.uniform);
      expect(delay).toBeGreaterThanOrEqual(d / 2);
      expect(delay).toBeLessThanOrEqual(d);
      sum += delay;
    }
    expectClose(sum / 2000, 0.75 * d, { rel: 0.01 });
  });

  it("nextAttemptDelayMs is deterministic for a given seed", () => {
    const run = (seed: number) => {
      const rng = createRandom(seed);
      return Array.from({ length: 10 }, (_, i) => nextAttemptDelayMs(i + 1, rng.uniform));
    };
    expect(run(5)).toEqual(run(5));
    expect(run(5)).not.toEqual(run(6));
  });

  it("nextAttemptDelayMs throws QaError for attempt < 1 and for random() outside [0, 1)", () => {
    expect(() => nextAttemptDelayMs(0, () => 0.5)).toThrow(QaError);
    expect(() => nextAttemptDelayMs(1.5, () => 0.5)).toThrow(/integer ≥ 1/);
    expect(() => nextAttemptDelayMs(1, () => 1)).toThrow(/\[0, 1\)/);
  });

  it("nextAttemptAt(now, attempt, random) adds the delay to now", () => {
    const now = new Date("2025-05-01T12:00:00Z");
    expect(nextAttemptAt(now, 2, () => 0).toISOString()).toBe("2025-05-01T12:01:00.000Z"); // d = 120 s, half = 60 s
  });
});

describe("shouldGiveUp", () => {
  it("shouldGiveUp(attempts) is false below MAX_ATTEMPTS and true from it", () => {
    expect(shouldGiveUp(0)).toBe(false);
    expect(shouldGiveUp(MAX_ATTEMPTS - 1)).toBe(false);
    expect(shouldGiveUp(MAX_ATTEMPTS)).toBe(true);
    expect(shouldGiveUp(MAX_ATTEMPTS + 5)).toBe(true);
    expect(() => shouldGiveUp(-1)).toThrow(QaError);
  });
});
