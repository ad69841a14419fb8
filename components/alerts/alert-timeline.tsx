import Link from "next/link";
import type { ReactNode } from "react";
import { cn } from "@/components/ui";
import { formatDateTime } from "@/lib/format/dates";
import type { AlertDetail } from "./alert-types";
import { proposalText } from "./cause-label";

interface TimelineEntry {
  key: string;
  at: string;
  title: ReactNode;
  body?: ReactNode;
  tone: "act" | "info" | "neutral" | "pass";
}

const DOT: Record<TimelineEntry["tone"], string> = {
  act: "border-act bg-act-soft",
  info: "border-info bg-info-soft",
  neutral: "border-line-strong bg-surface",
  pass: "border-pass bg-pass-soft",
};

const linkClass = "font-medium text-accent underline underline-offset-2";

export interface AlertTimelineProps {
  alert: AlertDetail;
  acknowledgedByName: string | null;
  resolvedByName: string | null;
}

/**
 * What happened to one alert, oldest first: opened, acknowledged, each service action, the passing re-test that
 * proposed resolution, and the resolution. Server-compatible.
 */
export function AlertTimeline({ alert, acknowledgedByName, resolvedByName }: AlertTimelineProps) {
  const entries: TimelineEntry[] = [
    {
      key: "opened",
      at: alert.openedAt,
      tone: "act",
      title: "Alert opened",
      body: alert.firstScanId ? (
        <Link href={`/scans/${alert.firstScanId}`} className={linkClass}>
          Result that opened it
        </Link>
      ) : null,
    },
  ];
  if (alert.acknowledgedAt) {
    entries.push({ key: "ack", at: alert.acknowledgedAt, tone: "info", title: <>Acknowledged by {acknowledgedByName ?? "a team member"}</> });
  }
  for (const s of alert.serviceEvents) {
    entries.push({
      key: `service-${s.id}`,
      at: s.performedAt,
      tone: "neutral",
      title: <>Service action by {s.engineer}</>,
      body: (
        <>
          <p className="whitespace-pre-line text-ink">{s.description}</p>
          <p>{s.parts ? <>Parts replaced: {s.parts}</> : "No parts replaced"}</p>
        </>
      ),
    });
  }
  if (alert.resolutionProposedAt) {
    entries.push({
      key: "retest",
      at: alert.resolutionProposedAt,
      tone: "pass",
      title: proposalText(alert.cause).event,
      body: alert.resolutionScanId ? (
        <Link href={`/scans/${alert.resolutionScanId}`} className={linkClass} data-testid="retest-link">
          {proposalText(alert.cause).link}
        </Link>
      ) : null,
    });
  }
  if (alert.resolvedAt) {
    entries.push({
      key: "resolved",
      at: alert.resolvedAt,
      tone: "pass",
      title: <>Resolved by {resolvedByName ?? "the physicist"}</>,
      body: alert.resolutionNote ? <p className="whitespace-pre-line text-ink">{alert.resolutionNote}</p> : null,
    });
  }
  // Opened first whatever the clocks say; the rest by time (a service can be logged with an earlier date).
  const [opened, ...rest] = entries;
  rest.sort((a, b) => new Date(a.at).getTime() - new Date(b.at).getTime());

  return (
    <ol className="flex flex-col" aria-label="Alert timeline" data-testid="alert-timeline">
      {[opened!, ...rest].map((e, i, all) => (
        <li key={e.key} className="relative flex gap-3 pb-4 last:pb-0">
          {i < all.length - 1 ? <span aria-hidden="true" className="absolute top-4 bottom-0 left-[5px] w-px bg-line" /> : null}
          <span aria-hidden="true" className={cn("relative mt-1.5 size-[11px] shrink-0 rounded-full border-2", DOT[e.tone])} />
          <div className="flex min-w-0 flex-col gap-0.5 text-body">
            <p className="font-medium text-ink">{e.title}</p>
            <time dateTime={e.at} className="tnum text-caption text-ink-subtle">
              {formatDateTime(e.at)}
            </time>
            {e.body ? <div className="mt-1 flex flex-col gap-1 text-ink-muted">{e.body}</div> : null}
          </div>
        </li>
      ))}
    </ol>
  );
}
