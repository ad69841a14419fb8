import { expect } from "vitest";

/**
 * Asserts |actual − expected| ≤ max(abs, rel·|expected|). Give at least one of rel/abs; the message names both values.
 */
export function expectClose(actual: number | null | undefined, expected: number, tol: { rel?: number; abs?: number }): void {
  expect(actual, `expected a number close to ${expected}`).toBeTypeOf("number");
  const a = actual as number;
  const allowed = Math.max(tol.abs ?? 0, (tol.rel ?? 0) * Math.abs(expected));
  const diff = Math.abs(a - expected);
  expect(
    diff <= allowed,
    `expected ${a} to be within ${allowed} of ${expected} (difference ${diff}, ${((100 * diff) / Math.abs(expected || 1)).toFixed(3)} %)`,
  ).toBe(true);
}
