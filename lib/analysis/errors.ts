/**
 * Raised when an image cannot be analysed by the requested method. The message states the violated
 * constraint and the offending value, e.g. "edge ROI must be at least 32 px wide, got 20".
 */
export class AnalysisError extends Error {
  readonly code: string;
  constructor(message: string, code = "analysis_failed") {
    super(message);
    this.name = "AnalysisError";
    this.code = code;
  }
}
