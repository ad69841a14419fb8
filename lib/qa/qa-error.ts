/**
 * Raised by the QA logic (baselines, tolerances, control limits, schedules, retries) when its input breaks a stated
 * constraint. The message names the constraint and the offending value, e.g.
 * "control limits need at least 2 baseline values, got 1".
 */
export class QaError extends Error {
  readonly code: string;
  constructor(message: string, code = "qa_invalid_input") {
    super(message);
    this.name = "QaError";
    this.code = code;
  }
}

/** Throws a QaError unless `value` is a finite number; `what` names the quantity in the message. */
export function assertFinite(value: number, what: string): void {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new QaError(`${what} must be a finite number, got ${String(value)}`);
  }
}
