import type { ScanDetail } from "@/db/queries/scans";
import type { AnalysisResult } from "@/lib/analysis/types";
import { toAnalysisJson } from "@/lib/report/analysis-json";

/** API shape of a scan: record fields, its current analysis in the CLI's JSON keys, evaluation and history. */
export function scanToJson(detail: ScanDetail) {
  const stored = detail.analysis?.result as (AnalysisResult & { evaluation?: unknown; driftFlags?: unknown }) | undefined;
  const timing = (detail.analysis?.options as { timingMs?: { decode: number; analysis: number } } | undefined)?.timingMs;
  return {
    scan: {
      id: detail.id,
      scannerId: detail.scannerId,
      scannerName: detail.scannerName,
      siteName: detail.siteName,
      testId: detail.testId,
      testName: detail.testName,
      fileName: detail.fileName,
      fileSize: detail.fileSize,
      fileSha256: detail.fileSha256,
      format: detail.format,
      acquiredAt: detail.acquiredAt,
      uploadedAt: detail.createdAt,
      uploadedBy: detail.uploadedByName,
      note: detail.note,
      attributes: detail.attributes,
      signOff: detail.signedOffAt ? { by: detail.signedOffByName, at: detail.signedOffAt, note: detail.signOffNote } : null,
    },
    analysis: stored
      ? {
          id: detail.analysis!.id,
          revision: detail.analysis!.revision,
          status: detail.analysis!.status,
          createdAt: detail.analysis!.createdAt,
          createdBy: detail.analysis!.createdByName,
          options: detail.analysis!.options,
          ...toAnalysisJson(stored, timing),
          roi: stored.roi,
          spread: stored.spread,
          mtfCurves: stored.mtfCurves ?? {},
          details: stored.details,
          evaluation: stored.evaluation ?? null,
          driftFlags: stored.driftFlags ?? [],
        }
      : null,
    history: detail.history,
  };
}
