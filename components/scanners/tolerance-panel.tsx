"use client";

import { useState } from "react";
import { Button, Callout, Card, CardDescription, CardHeader, CardTitle, EmptyState, SkeletonText, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { errorMessage } from "@/lib/api/fetch-json";
import { METRICS } from "@/lib/qa/metrics";
import { directionText, formatLevel } from "./qa-format";
import type { ToleranceRowJson } from "./qa-types";
import { ToleranceDialog } from "./tolerance-dialog";
import { useScannerTests, useTolerances } from "./use-scanner-queries";

/**
 * Warning and action levels per test × metric, with mode, bad direction and source; "Default" marks levels not yet
 * set for this scanner (the modality default). Physicists edit one row at a time.
 */
export function TolerancePanel({ scannerId, canEdit }: { scannerId: number; canEdit: boolean }) {
  const tolerances = useTolerances(scannerId);
  const tests = useScannerTests(scannerId);
  const [editing, setEditing] = useState<ToleranceRowJson | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const testName = new Map((tests.data ?? []).map((t) => [t.id, t.name]));
  const nameOf = (id: number) => testName.get(id) ?? `Test ${id}`;

  return (
    <Card aria-labelledby="tolerances-title" data-testid="tolerance-panel">
      <CardHeader>
        <CardTitle id="tolerances-title">Tolerances</CardTitle>
        <CardDescription>
          When a result is flagged. No universal numeric tolerance is published for resolution tests: set levels that follow your QA programme and
          the manufacturer&apos;s specification, and name their source.
        </CardDescription>
      </CardHeader>
      {notice ? (
        <div className="px-4 pt-3">
          <Callout tone="success" role="status" title="Levels saved" actions={<Button variant="ghost" size="sm" onClick={() => setNotice(null)}>Dismiss</Button>}>
            {notice}
          </Callout>
        </div>
      ) : null}
      {tolerances.isPending ? (
        <div className="p-4">
          <SkeletonText lines={4} />
        </div>
      ) : tolerances.error ? (
        <div className="p-4">
          <Callout tone="error" title="The tolerances could not be loaded">{errorMessage(tolerances.error)}</Callout>
        </div>
      ) : tolerances.data.length === 0 ? (
        <EmptyState size="compact" title="No tolerances" description="Levels appear once the scanner has a routine test." />
      ) : (
        <Table caption="Tolerances per test and metric" captionHidden density="compact" data-testid="tolerance-table">
          <THead>
            <Tr>
              <Th>Test</Th>
              <Th>Metric</Th>
              <Th>Mode</Th>
              <Th numeric>Warning</Th>
              <Th numeric>Action</Th>
              <Th>Direction</Th>
              <Th>Source</Th>
              {canEdit ? (
                <Th>
                  <span className="sr-only">Edit</span>
                </Th>
              ) : null}
            </Tr>
          </THead>
          <TBody>
            {tolerances.data.map((t) => {
              const label = METRICS[t.metric].label;
              return (
                <Tr key={`${t.testId}-${t.metric}`} data-testid={`tolerance-row-${t.testId}-${t.metric}`}>
                  <Td>{nameOf(t.testId)}</Td>
                  <Td className="font-medium">{label}</Td>
                  <Td muted>{t.mode === "relative" ? "% of baseline" : "Absolute"}</Td>
                  <Td numeric data-testid="tolerance-warning">{formatLevel(t.metric, t.mode, t.warning)}</Td>
                  <Td numeric data-testid="tolerance-action">{formatLevel(t.metric, t.mode, t.action)}</Td>
                  <Td muted>{directionText(t.metric)}</Td>
                  <Td wrap className="max-w-96">
                    <span className="flex items-start gap-2">
                      {t.isDefault ? (
                        <span className="mt-0.5 shrink-0 rounded-chip border border-line-strong bg-surface-sunken px-1.5 text-caption font-medium text-ink-muted">Default</span>
                      ) : null}
                      <span className="line-clamp-2 text-caption text-ink-muted" title={t.source}>
                        {t.source}
                      </span>
                    </span>
                  </Td>
                  {canEdit ? (
                    <Td>
                      <Button variant="ghost" size="sm" aria-label={`Edit ${label} tolerance of ${nameOf(t.testId)}`} onClick={() => setEditing(t)}>
                        Edit
                      </Button>
                    </Td>
                  ) : null}
                </Tr>
              );
            })}
          </TBody>
        </Table>
      )}
      <ToleranceDialog
        scannerId={scannerId}
        testName={editing ? nameOf(editing.testId) : ""}
        row={editing}
        onClose={() => setEditing(null)}
        onSaved={(text) => {
          setEditing(null);
          setNotice(text);
        }}
      />
    </Card>
  );
}
