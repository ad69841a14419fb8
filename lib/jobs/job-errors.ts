/** Errors crossing the worker boundary keep their kind and code so the server can map them to HTTP answers. */
export interface SerialisedJobError {
  name: "ImageDecodeError" | "AnalysisError" | "Error";
  code: string;
  message: string;
}

export class JobError extends Error {
  readonly kind: SerialisedJobError["name"];
  readonly code: string;
  constructor(e: SerialisedJobError) {
    super(e.message);
    this.name = "JobError";
    this.kind = e.name;
    this.code = e.code;
  }
}

export function serialiseError(err: unknown): SerialisedJobError {
  if (err instanceof Error) {
    const name = err.name === "ImageDecodeError" || err.name === "AnalysisError" ? err.name : "Error";
    const code = (err as { code?: unknown }).code;
    return { name, code: typeof code === "string" ? code : "internal", message: err.message };
  }
  return { name: "Error", code: "internal", message: String(err) };
}
