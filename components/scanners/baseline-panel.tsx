"use client";

import { useState } from "react";
import { Button, Callout, Card, CardDescription, CardHeader, CardTitle, EmptyState, SkeletonText, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { errorMessage } from "@/lib/api/fetch-json";
import { isMetricKey, METRIC_KEYS, METRICS } from "@/lib/qa/metrics";
import { BaselineDialog } from "./baseline-dialog";
import { formatDate, formatValue } from "./qa-format";
import type { BaselineJson } from "./qa-types";
import { useBaselines, useScannerTests } from "./use-scanner-queries";

export interface BaselinePanelProps {
  scannerId: number;
  canEdit: boolean;
  /** Names of users who may have set baselines (id → name); others show as "user {id}". */
  people: Record<number, string>;
}

const metricOrder = (m: string) => (isMetricKey(m) ? METRIC_KEYS.indexOf(m) : 99);

/** Mean ± SD with the metric's unit: "0.412 ± 0.0061 cycles/mm" (the SD with one more digit, so a small one is not "0.00"). */
function meanText(b: BaselineJson): string {
  if (!isMetricKey(b.metric)) return String(b.mean);
  const unit = METRICS[b.metric].unit;
  const sd = b.sd === null ? "" : ` ± ${b.sd.toFixed(METRICS[b.metric].digits + 1)}`;
  return `${formatValue(b.metric, b.mean)}${sd}${unit ? ` ${unit}` : ""}`;
}

/**
 * Baselines in force per test × metric (mean ± 1 SD, n, when, why and by whom), optionally with the superseded ones;
 * physicists set a new baseline from chosen results.
 */
export function BaselinePanel({ scannerId, canEdit, people }: BaselinePanelProps) {
  const [history, setHistory] = useState(false);
  const [editing, setEditing] = useState(false);
  const [notice, setNotice] = useState<string | null>(null);
  const baselines = useBaselines(scannerId, history);
  const tests = useScannerTests(scannerId);
  const testName = new Map((tests.data ?? []).map((t) => [t.id, t.name]));
  const rows = [...(baselines.data ?? [])].sort(
    (a, b) =>
      a.testId - b.testId ||
      Number(a.supersededAt !== null) - Number(b.supersededAt !== null) ||
      metricOrder(a.metric) - metricOrder(b.metric) ||
      b.setAt.localeCompare(a.setAt),
  );

  return (
    <Card aria-labelledby="baselines-title" data-testid="baseline-panel">
      <CardHeader
        actions={
          <>
            <Button variant="ghost" size="sm" aria-pressed={history} onClick={() => setHistory((h) => !h)}>
              {history ? "Hide history" : "Show history"}
            </Button>
            {canEdit && tests.data && tests.data.length > 0 ? (
              <Button variant="secondary" size="sm" onClick={() => setEditing(true)}>
                Set new baseline
              </Button>
            ) : null}
          </>
        }
      >
        <CardTitle id="baselines-title">Baselines</CardTitle>
        <CardDescription>Reference values each result is compared with: mean ± 1 SD of the results chosen, per test and metric.</CardDescription>
      </CardHeader>
      {notice ? (
        <div className="px-4 pt-3">
          <Callout tone="success" role="status" title="Baseline set" actions={<Button variant="ghost" size="sm" onClick={() => setNotice(null)}>Dismiss</Button>}>
            {notice}
          </Callout>
        </div>
      ) : null}
      {baselines.isPending ? (
        <div className="p-4">
          <SkeletonText lines={3} />
        </div>
      ) : baselines.error ? (
        <div className="p-4">
          <Callout tone="error" title="The baselines could not be loaded">{errorMessage(baselines.error)}</Callout>
        </div>
      ) : rows.length === 0 ? (
        <EmptyState
          size="compact"
          title="No baseline yet"
          description={
            canEdit
              ? "Results are shown as “No baseline” until you set one from results taken at acceptance or after major service."
              : "Results are shown as “No baseline” until a physicist sets one."
          }
        />
      ) : (
        <Table caption={history ? "Baselines, with history" : "Baselines in force"} captionHidden density="compact">
          <THead>
            <Tr>
              <Th>Test</Th>
              <Th>Metric</Th>
              <Th numeric>Mean ± SD</Th>
              <Th numeric>n</Th>
              <Th>Set</Th>
              <Th>Reason</Th>
              <Th>Set by</Th>
              {history ? <Th>In force</Th> : null}
            </Tr>
          </THead>
          <TBody>
            {rows.map((b) => (
              <Tr key={b.id} className={b.supersededAt ? "text-ink-subtle" : undefined}>
                <Td>{testName.get(b.testId) ?? `Test ${b.testId}`}</Td>
                <Td>{isMetricKey(b.metric) ? METRICS[b.metric].label : b.metric}</Td>
                <Td numeric>{meanText(b)}</Td>
                <Td numeric>{b.n}</Td>
                <Td muted>{formatDate(b.setAt)}</Td>
                <Td wrap className="max-w-80">{b.reason}</Td>
                <Td muted>{people[b.setById] ?? `user ${b.setById}`}</Td>
                {history ? <Td muted>{b.supersededAt ? `Superseded ${formatDate(b.supersededAt)}` : "Current"}</Td> : null}
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
      <BaselineDialog
        scannerId={scannerId}
        tests={tests.data ?? []}
        open={editing && Boolean(tests.data)}
        onClose={() => setEditing(false)}
        onSaved={(text) => {
          setEditing(false);
          setNotice(text);
        }}
      />
    </Card>
  );
}
