"use client";

import Link from "next/link";
import { useState } from "react";
import { Button, Callout, Card, CardDescription, CardHeader, CardTitle, EmptyState, SkeletonText, StatusBadge, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { errorMessage } from "@/lib/api/fetch-json";
import { dueSummary, formatDate, FREQUENCY_LABELS, METHOD_NAMES } from "./qa-format";
import { ScheduleDialog } from "./schedule-dialog";
import { useScannerTests } from "./use-scanner-queries";

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** The scanner's routine tests: frequency, last result and due or overdue state; physicists and admins edit them. */
export function SchedulePanel({ scannerId, canEdit }: { scannerId: number; canEdit: boolean }) {
  const tests = useScannerTests(scannerId);
  const [editing, setEditing] = useState(false);
  return (
    <Card aria-labelledby="schedule-title" data-testid="schedule-panel">
      <CardHeader
        actions={
          canEdit && tests.data ? (
            <Button variant="secondary" size="sm" onClick={() => setEditing(true)}>
              {tests.data.length ? "Edit schedule" : "Add a test"}
            </Button>
          ) : null
        }
      >
        <CardTitle id="schedule-title">Schedule</CardTitle>
        <CardDescription>Routine tests, how often they are due, and where each stands.</CardDescription>
      </CardHeader>
      {tests.isPending ? (
        <div className="p-4">
          <SkeletonText lines={3} />
        </div>
      ) : tests.error ? (
        <div className="p-4">
          <Callout tone="error" title="The schedule could not be loaded">{errorMessage(tests.error)}</Callout>
        </div>
      ) : tests.data.length === 0 ? (
        <EmptyState size="compact" title="No routine tests" description={canEdit ? "Add the test this scanner undergoes and how often." : "A physicist sets up the routine tests."} />
      ) : (
        <Table caption="Routine tests and schedule" captionHidden density="compact">
          <THead>
            <Tr>
              <Th>Test</Th>
              <Th>Method</Th>
              <Th>Frequency</Th>
              <Th>Last result</Th>
              <Th>Next test</Th>
            </Tr>
          </THead>
          <TBody>
            {tests.data.map((t) => {
              const s = t.schedule;
              const due = s ? dueSummary(s) : null;
              return (
                <Tr key={t.id}>
                  <Td wrap>
                    <span className="font-medium">{t.name}</span>
                    {t.phantom ? <span className="block text-caption text-ink-subtle">{t.phantom}</span> : null}
                  </Td>
                  <Td muted>{METHOD_NAMES[t.method]}</Td>
                  <Td>{FREQUENCY_LABELS[t.frequency]}</Td>
                  <Td>
                    {s?.lastScanId && s.status ? (
                      <span className="flex items-center gap-2">
                        <StatusBadge status={s.status} size="sm" />
                        <Link href={`/scans/${s.lastScanId}`} className="text-accent underline-offset-2 hover:underline">
                          {formatDate(s.lastTestAt)}
                        </Link>
                      </span>
                    ) : (
                      <span className="text-ink-subtle">None yet</span>
                    )}
                  </Td>
                  <Td>
                    {!t.active ? (
                      <span className="text-ink-subtle">Retired</span>
                    ) : due?.badge ? (
                      <StatusBadge status={due.badge} label={capitalise(due.text)} size="sm" />
                    ) : (
                      <span className="text-ink-muted">{due ? capitalise(due.text) : "—"}</span>
                    )}
                  </Td>
                </Tr>
              );
            })}
          </TBody>
        </Table>
      )}
      <ScheduleDialog scannerId={scannerId} tests={tests.data ?? []} open={editing && Boolean(tests.data)} onClose={() => setEditing(false)} />
    </Card>
  );
}
