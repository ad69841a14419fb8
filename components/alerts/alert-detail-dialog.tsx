"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useId, useState } from "react";
import { Button, Callout, Dialog, SkeletonText, StatusBadge } from "@/components/ui";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { formatDateTime } from "@/lib/format/dates";
import { AcknowledgeDialog } from "./acknowledge-dialog";
import { AlertTimeline } from "./alert-timeline";
import { alertKeys, alertsUrl, type AlertDetail, type AlertPermissions, type AlertRow } from "./alert-types";
import { CAUSE_META, CauseLabel, proposalText } from "./cause-label";
import { ResolveDialog } from "./resolve-dialog";
import { ServiceActionDialog } from "./service-action-dialog";

type Action = "acknowledge" | "service" | "resolve";

export interface AlertDetailDialogProps {
  /** The row that was opened: names of scanner, site, test and people (the detail endpoint has ids only). */
  row: AlertRow;
  permissions: AlertPermissions;
  onClose: () => void;
}

/**
 * One alert: what opened it, its timeline and the next steps the user's role allows. The action forms open as
 * dialogs of their own above this one; after each, the alert and the lists are refetched.
 */
export function AlertDetailDialog({ row: openedRow, permissions, onClose }: AlertDetailDialogProps) {
  const id = openedRow.id;
  const hintId = useId();
  const [action, setAction] = useState<Action | null>(null);

  const detail = useQuery({
    queryKey: alertKeys.detail(id),
    queryFn: ({ signal }) => fetchJson<{ alert: AlertDetail }>(`/api/alerts/${id}`, { signal }).then((r) => r.alert),
  });
  // Fresh names (who acknowledged, who resolved) after an action: the scanner's alerts in every state.
  const scannerFilter = { state: "all" as const, cause: "", scannerId: openedRow.scannerId };
  const scannerAlerts = useQuery({
    queryKey: alertKeys.list(scannerFilter),
    queryFn: ({ signal }) => fetchJson<{ alerts: AlertRow[] }>(alertsUrl(scannerFilter), { signal }).then((r) => r.alerts),
  });
  const row = scannerAlerts.data?.find((a) => a.id === id) ?? openedRow;
  const alert = detail.data;
  const state = alert?.state ?? row.state;
  const proposedAt = alert ? alert.resolutionProposedAt : row.resolutionProposedAt;
  const needsRetest = (row.cause === "action" || row.cause === "warning") && !proposedAt;
  const subject = `${CAUSE_META[row.cause].label} alert on ${row.scannerName}`;
  const closed = state === "resolved";

  const canAcknowledge = permissions.acknowledge && state === "open";
  const canLogService = permissions.logService && !closed;
  const canResolve = permissions.resolve && !closed;
  const resolveReady = canResolve && !needsRetest;

  return (
    <>
      <Dialog
        open
        size="lg"
        onOpenChange={(open) => {
          if (!open) onClose();
        }}
        title={subject}
        description={
          <>
            {row.siteName}
            {row.testName ? ` · ${row.testName}` : ""} ·{" "}
            <Link href={`/scanners/${row.scannerId}`} className="font-medium text-accent underline underline-offset-2">
              Scanner page
            </Link>
          </>
        }
        footer={
          <>
            {canAcknowledge ? (
              <Button variant={resolveReady ? "secondary" : "primary"} onClick={() => setAction("acknowledge")}>
                Acknowledge
              </Button>
            ) : null}
            {canLogService ? (
              <Button variant="secondary" onClick={() => setAction("service")}>
                Log service action
              </Button>
            ) : null}
            {canResolve ? (
              <Button
                variant={resolveReady || !canAcknowledge ? "primary" : "secondary"}
                onClick={() => setAction("resolve")}
                disabled={needsRetest || !alert}
                aria-describedby={needsRetest ? hintId : undefined}
              >
                Resolve
              </Button>
            ) : null}
            <Button variant={canAcknowledge || canLogService || canResolve ? "ghost" : "primary"} onClick={onClose}>
              Close
            </Button>
          </>
        }
      >
        <div className="flex flex-col gap-5" data-testid="alert-detail">
          <div className="flex flex-wrap items-center gap-2">
            <StatusBadge status={state} srPrefix="Alert state:" />
            <CauseLabel cause={row.cause} className="text-body text-ink-muted" />
            {proposedAt && !closed ? <StatusBadge status="pass" label={proposalText(row.cause).marker} /> : null}
          </div>

          <section aria-labelledby={`${hintId}-what`} className="flex flex-col gap-2">
            <h3 id={`${hintId}-what`} className="text-body font-semibold text-ink">
              What was found
            </h3>
            <p className="text-body text-ink">{alert?.summary ?? row.summary}</p>
            <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-body">
              <dt className="text-ink-muted">Opened</dt>
              <dd className="tnum">{formatDateTime(row.openedAt)}</dd>
              <dt className="text-ink-muted">Occurrences</dt>
              <dd className="tnum">
                {alert?.occurrences ?? row.occurrences}
                {(alert?.latestScanId ?? row.latestScanId) && (alert?.occurrences ?? row.occurrences) > 1 ? (
                  <>
                    {" "}
                    ·{" "}
                    <Link href={`/scans/${alert?.latestScanId ?? row.latestScanId}`} className="font-medium text-accent underline underline-offset-2">
                      latest result
                    </Link>
                  </>
                ) : null}
              </dd>
            </dl>
          </section>

          <section aria-labelledby={`${hintId}-timeline`} className="flex flex-col gap-3">
            <h3 id={`${hintId}-timeline`} className="text-body font-semibold text-ink">
              Timeline
            </h3>
            {detail.isPending ? (
              <SkeletonText lines={4} />
            ) : detail.isError ? (
              <Callout
                tone="error"
                title="The alert could not be loaded"
                actions={
                  <Button variant="secondary" size="sm" onClick={() => detail.refetch()}>
                    Try again
                  </Button>
                }
              >
                {errorMessage(detail.error)}
              </Callout>
            ) : (
              <AlertTimeline alert={detail.data} acknowledgedByName={row.acknowledgedByName} resolvedByName={row.resolvedByName} />
            )}
          </section>

          {!closed ? (
            <NextStep hintId={hintId} row={row} needsRetest={needsRetest} permissions={permissions} />
          ) : null}
        </div>
      </Dialog>

      {action === "acknowledge" ? <AcknowledgeDialog alertId={id} subject={subject} onClose={() => setAction(null)} /> : null}
      {action === "service" ? <ServiceActionDialog alertId={id} subject={subject} onClose={() => setAction(null)} /> : null}
      {action === "resolve" ? (
        <ResolveDialog alertId={id} subject={subject} retest={{ scanId: alert?.resolutionScanId ?? null, at: proposedAt, what: row.cause === "overdue" ? "Test done" : "Re-test passed" }} onClose={() => setAction(null)} />
      ) : null}
    </>
  );
}

/** One sentence on what closes this alert, and why Resolve may still be disabled. */
function NextStep({ hintId, row, needsRetest, permissions }: { hintId: string; row: AlertRow; needsRetest: boolean; permissions: AlertPermissions }) {
  const uploadLink = permissions.upload ? (
    <>
      {" "}
      <Link href={`/scans/new?scannerId=${row.scannerId}`}>Upload a re-test</Link>.
    </>
  ) : null;
  if (needsRetest) {
    return (
      <div id={hintId}>
        <Callout tone="info" title="Needs a passing re-test">
          The alert can be resolved once a new result of this test on {row.scannerName} is back within tolerance
          {permissions.resolve ? "." : "; the responsible physicist then closes it."}
          {uploadLink}
        </Callout>
      </div>
    );
  }
  if (row.cause === "action" || row.cause === "warning") {
    return (
      <Callout tone="success" title="Re-test passed — ready to resolve">
        {permissions.resolve ? "Check the re-test result, then resolve the alert with a note." : "The responsible physicist checks the re-test and resolves the alert."}
      </Callout>
    );
  }
  return (
    <Callout tone="info" title="How this alert closes">
      {row.cause === "overdue"
        ? "Doing the overdue test proposes resolution; the physicist then resolves the alert with a note."
        : "A drift advisory needs no re-test: the physicist resolves it with a note once the trend is explained or corrected."}
      {permissions.resolve ? null : " Only the physicist can resolve alerts."}
    </Callout>
  );
}
