"use client";

import { useQuery } from "@tanstack/react-query";
import { isMetricKey, type MetricKey } from "@/lib/qa/metrics";

/** One row of GET /api/scanners/{id}/baselines. */
interface BaselineRowJson {
  testId: number;
  metric: string;
  mean: number;
  sd: number | null;
  n: number;
  setAt: string;
  mtfCurve: { frequencyCyclesPerMm: number[]; value: number[] } | null;
}

/** The baseline of one test: metric means and, when stored, the averaged baseline MTF curve. */
export interface TestBaseline {
  means: Partial<Record<MetricKey, number>>;
  /** Frequencies in cycles/mm, MTF normalised to 1 at f = 0. */
  mtfCurve: { frequency: number[]; value: number[] } | null;
  setAt: string | null;
}

export type BaselineLoad =
  | { state: "loading"; baseline: null }
  | { state: "ready"; baseline: TestBaseline | null }
  /** The endpoint is missing or failed: the page works without a baseline overlay. */
  | { state: "unavailable"; baseline: null };

async function loadBaselines(scannerId: number, signal: AbortSignal): Promise<BaselineRowJson[] | null> {
  try {
    const res = await fetch(`/api/scanners/${scannerId}/baselines`, { signal, credentials: "same-origin", headers: { accept: "application/json" } });
    if (!res.ok) return null;
    const body = (await res.json()) as { baselines?: unknown };
    return Array.isArray(body.baselines) ? (body.baselines as BaselineRowJson[]) : null;
  } catch (err) {
    if (err instanceof DOMException && err.name === "AbortError") throw err;
    return null;
  }
}

function forTest(rows: BaselineRowJson[], testId: number | null): TestBaseline | null {
  const mine = rows.filter((r) => testId === null || r.testId === testId);
  if (mine.length === 0) return null;
  const means: Partial<Record<MetricKey, number>> = {};
  let curve: TestBaseline["mtfCurve"] = null;
  let setAt: string | null = null;
  for (const r of mine) {
    if (isMetricKey(r.metric) && Number.isFinite(r.mean)) means[r.metric] = r.mean;
    if (!curve && r.mtfCurve && r.mtfCurve.frequencyCyclesPerMm.length > 1) {
      curve = { frequency: r.mtfCurve.frequencyCyclesPerMm, value: r.mtfCurve.value };
    }
    if (!setAt || r.setAt > setAt) setAt = r.setAt;
  }
  return { means, mtfCurve: curve, setAt };
}

/**
 * The scanner's baseline for one test, fetched once per page (react-query dedupes the chart and the preview).
 * Any failure (404 while the endpoint does not exist, 403, network) gives "unavailable", never an error screen.
 */
export function useScannerBaselines(scannerId: number, testId: number | null): BaselineLoad {
  const query = useQuery({
    queryKey: ["scanners", scannerId, "baselines"],
    queryFn: ({ signal }) => loadBaselines(scannerId, signal),
    retry: false,
    staleTime: 60_000,
  });
  if (query.isPending) return { state: "loading", baseline: null };
  if (!query.data) return { state: "unavailable", baseline: null };
  return { state: "ready", baseline: forTest(query.data, testId) };
}
