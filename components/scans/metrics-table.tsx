import { StatusBadge, Table, TBody, Td, Th, THead, Tr, formatMetric } from "@/components/ui";
import { METRICS, metricsForMethod, type MetricKey } from "@/lib/qa/metrics";
import type { AnalysisJsonView, MetricEvaluationJson, ToleranceJson } from "./scan-types";

export interface MetricsTableProps {
  analysis: AnalysisJsonView;
}

/** Row headers look like body cells: the table shell's Th is styled for column headers. */
const ROW_HEADER = "px-4 py-2.5 text-left align-middle font-medium whitespace-nowrap text-ink group-data-[density=compact]/table:py-1.5";

/** "1.23 mm", "0.612 cycles/mm", "0.084" (MTF is a ratio). */
function withUnit(value: number | null, digits: number, unit: string): string {
  const text = formatMetric(value, digits);
  return text === "—" || unit === "" ? text : `${text} ${unit}`;
}

function toleranceText(metric: MetricKey, tolerance: ToleranceJson | null): string {
  if (!tolerance) return "—";
  const { digits, unit, direction } = METRICS[metric];
  if (tolerance.mode === "relative") {
    const side = direction === "higher-is-worse" ? "above" : "below";
    return `warning ${formatMetric(tolerance.warning, 1)} %, action ${formatMetric(tolerance.action, 1)} % ${side} baseline`;
  }
  const op = direction === "higher-is-worse" ? "≥" : "≤";
  return `warning ${op} ${withUnit(tolerance.warning, digits, unit)}, action ${op} ${withUnit(tolerance.action, digits, unit)}`;
}

function sourceText(tolerance: ToleranceJson): string {
  return `${tolerance.source}${tolerance.isDefault ? " (Halfmax default, until a physicist sets the scanner's own)" : ""}`;
}

function deviationText(percent: number | null): string {
  if (percent === null || !Number.isFinite(percent)) return "—";
  const text = formatMetric(percent, 1);
  return percent > 0 && text !== "0.0" ? `+${text} %` : `${text} %`;
}

/** Evaluated rows, in catalogue order; falls back to bare values when the analysis has no evaluation. */
function evaluatedRows(analysis: AnalysisJsonView): MetricEvaluationJson[] {
  if (analysis.evaluation && analysis.evaluation.metrics.length > 0) return analysis.evaluation.metrics;
  const values = analysis as unknown as Record<string, unknown>;
  return metricsForMethod(analysis.method).map((metric) => {
    const v = values[metric];
    return { metric, value: typeof v === "number" ? v : null, status: "no-baseline", deviationPercent: null, message: "Not evaluated", baselineMean: null, tolerance: null };
  });
}

/**
 * The measured metrics with their units, status against the baseline, baseline mean, deviation and the tolerance in
 * force with its source; then the Nyquist frequency and (edge/line) the angle, which are reported but not evaluated.
 * Server-compatible.
 */
export function MetricsTable({ analysis }: MetricsTableProps) {
  const rows = evaluatedRows(analysis);
  // Sources are long sentences: number them and list them once under the table.
  const sources: string[] = [];
  for (const r of rows) {
    if (r.tolerance && !sources.includes(sourceText(r.tolerance))) sources.push(sourceText(r.tolerance));
  }
  const sourceNumber = (t: ToleranceJson) => sources.indexOf(sourceText(t)) + 1;
  const angleLabel = analysis.method === "line" ? "Line angle" : "Edge angle";
  return (
    <div className="flex flex-col gap-2">
      <Table caption="Measured metrics against the baseline" captionHidden density="compact" data-testid="metrics-table">
        <THead>
          <Tr>
            <Th>Metric</Th>
            <Th numeric>Value</Th>
            <Th>Status</Th>
            <Th numeric>Baseline mean</Th>
            <Th numeric>Deviation</Th>
            <Th>Tolerance</Th>
          </Tr>
        </THead>
        <TBody>
          {rows.map((row) => {
            const def = METRICS[row.metric];
            return (
              <Tr key={row.metric} data-metric={row.metric}>
                <th scope="row" className={ROW_HEADER}>
                  <span title={def.description}>{def.label}</span>
                </th>
                <Td numeric data-testid={`metric-value-${row.metric}`}>
                  {withUnit(row.value, def.digits, def.unit)}
                </Td>
                <Td>
                  <StatusBadge
                    status={row.status}
                    size="sm"
                    title={row.message}
                    label={row.status === "no-baseline" && row.baselineMean !== null ? "Not evaluated" : undefined}
                  />
                  <span className="sr-only">: {row.message}</span>
                </Td>
                <Td numeric muted>
                  {withUnit(row.baselineMean, def.digits, def.unit)}
                </Td>
                <Td numeric muted>
                  {deviationText(row.deviationPercent)}
                </Td>
                <Td muted className="text-caption">
                  {row.tolerance ? (
                    <span className="block min-w-48 whitespace-normal">
                      {toleranceText(row.metric, row.tolerance)}
                      <sup className="ml-0.5">
                        <a href={`#tolerance-source-${sourceNumber(row.tolerance)}`} aria-label={`source ${sourceNumber(row.tolerance)}`} className="text-accent no-underline">
                          [{sourceNumber(row.tolerance)}]
                        </a>
                      </sup>
                    </span>
                  ) : (
                    "No tolerance set"
                  )}
                </Td>
              </Tr>
            );
          })}
          <Tr data-metric="nyquist">
            <th scope="row" className={ROW_HEADER}>
              Nyquist frequency
            </th>
            <Td numeric data-testid="metric-value-nyquist">
              {withUnit(analysis.nyquist, 3, "cycles/mm")}
            </Td>
            <Td muted className="text-caption" colSpan={4}>
              1/(2 × pixel spacing); reported, not evaluated
            </Td>
          </Tr>
          {analysis.edgeAngleDeg !== undefined && (analysis.method === "edge" || analysis.method === "line") ? (
            <Tr data-metric="edgeAngleDeg">
              <th scope="row" className={ROW_HEADER}>
                {angleLabel}
              </th>
              <Td numeric data-testid="metric-value-edgeAngleDeg">
                {formatMetric(analysis.edgeAngleDeg, 2)}°
              </Td>
              <Td muted className="text-caption" colSpan={4}>
                Angle to the nearest image axis; reported, not evaluated
              </Td>
            </Tr>
          ) : null}
        </TBody>
      </Table>
      {sources.length > 0 ? (
        <ol className="flex flex-col gap-1 px-4 text-caption text-ink-muted" aria-label="Sources of the tolerances">
          {sources.map((text, i) => (
            <li key={text} id={`tolerance-source-${i + 1}`}>
              [{i + 1}] {text}
            </li>
          ))}
        </ol>
      ) : null}
      <p className="px-4 text-caption text-ink-muted">
        Frequencies in cycles/mm, which equal line pairs per mm (lp/mm); 1 lp/mm = 10 lp/cm. MTF values are ratios (1 at zero frequency).
        Deviation is relative to the baseline mean (positive = above it).
      </p>
    </div>
  );
}
