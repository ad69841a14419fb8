"use client";

import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/lib/api/fetch-json";
import { qaKeys, type BaselineJson, type QaTestJson, type ScanListItemJson, type ScanListJson, type ToleranceRowJson } from "./qa-types";

/** GET /api/scanners/{id}/tests: routine tests with their schedule state. */
export function useScannerTests(scannerId: number) {
  return useQuery({
    queryKey: qaKeys.tests(scannerId),
    queryFn: ({ signal }) => fetchJson<{ tests: QaTestJson[] }>(`/api/scanners/${scannerId}/tests`, { signal }).then((r) => r.tests),
  });
}

/** GET /api/scanners/{id}/baselines (history adds superseded baselines). */
export function useBaselines(scannerId: number, history: boolean) {
  return useQuery({
    queryKey: qaKeys.baselines(scannerId, history),
    queryFn: ({ signal }) =>
      fetchJson<{ baselines: BaselineJson[] }>(`/api/scanners/${scannerId}/baselines${history ? "?history=1" : ""}`, { signal }).then((r) => r.baselines),
  });
}

/** GET /api/scanners/{id}/tolerances: stored or default levels per test × metric. */
export function useTolerances(scannerId: number) {
  return useQuery({
    queryKey: qaKeys.tolerances(scannerId),
    queryFn: ({ signal }) => fetchJson<{ tolerances: ToleranceRowJson[] }>(`/api/scanners/${scannerId}/tolerances`, { signal }).then((r) => r.tolerances),
  });
}

const PAGE_SIZE = 200;
/** Upper bound of rows read for one table (10 pages); the table says so when a range holds more. */
export const MAX_SCAN_ROWS = 2000;

/**
 * GET /api/scans?scannerId=…&from=…&to=… read page by page (the API pages at ≤ 200) up to MAX_SCAN_ROWS, newest
 * first, for a client-side sortable table.
 */
export function useScannerScans(scannerId: number, range: { from: string; to: string }) {
  return useQuery({
    queryKey: qaKeys.scans(scannerId, range),
    queryFn: async ({ signal }) => {
      const scans: ScanListItemJson[] = [];
      let total = 0;
      for (let page = 1; scans.length < MAX_SCAN_ROWS; page++) {
        const p = new URLSearchParams({ scannerId: String(scannerId), page: String(page), pageSize: String(PAGE_SIZE) });
        if (range.from) p.set("from", range.from);
        if (range.to) p.set("to", range.to);
        const r = await fetchJson<ScanListJson>(`/api/scans?${p}`, { signal });
        scans.push(...r.scans);
        total = r.total;
        if (r.scans.length < PAGE_SIZE || scans.length >= total) break;
      }
      return { scans, total };
    },
  });
}
