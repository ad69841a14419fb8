import { StatusBadge, Table, TBody, Td, Th, THead, Tr, formatMetric } from "@/components/ui";
import { formatScanDateTime } from "./format";
import { METHOD_LABELS, type HistoryEntryJson, type MethodChoiceKey } from "./scan-types";

export interface AnalysisHistoryProps {
  history: HistoryEntryJson[];
}

/** The options a revision was run with, in words: method choice, ROI, pixel spacing override, reason. */
export function describeAnalysisOptions(entry: HistoryEntryJson): string {
  const o = (entry.options ?? {}) as {
    method?: MethodChoiceKey;
    roi?: { x: number; y: number; width: number; height: number } | null;
    pixelSpacingMm?: { x: number; y: number } | null;
    reason?: string | null;
  };
  const parts: string[] = [];
  if (o.method === "auto") parts.push(`method chosen automatically`);
  else if (o.method) parts.push(`method set by hand`);
  parts.push(o.roi ? `ROI x ${o.roi.x}, y ${o.roi.y}, ${o.roi.width} × ${o.roi.height} px` : "ROI found automatically");
  if (o.pixelSpacingMm) {
    parts.push(
      o.pixelSpacingMm.x === o.pixelSpacingMm.y
        ? `pixel spacing ${formatMetric(o.pixelSpacingMm.x, 4)} mm (given)`
        : `pixel spacing ${formatMetric(o.pixelSpacingMm.y, 4)} × ${formatMetric(o.pixelSpacingMm.x, 4)} mm, row × column (given)`,
    );
  }
  if (o.reason) parts.push(`reason: ${o.reason}`);
  return parts.join("; ");
}

/** Every analysis revision of a scan, newest first; the current one is marked. Server-compatible. */
export function AnalysisHistory({ history }: AnalysisHistoryProps) {
  return (
    <Table caption="Analysis revisions of this scan" captionHidden density="compact" data-testid="analysis-history">
      <THead>
        <Tr>
          <Th numeric>Revision</Th>
          <Th>Analysed</Th>
          <Th>By</Th>
          <Th>Method</Th>
          <Th>Status</Th>
          <Th>Options</Th>
          <Th>Software</Th>
        </Tr>
      </THead>
      <TBody>
        {history.map((h) => (
          <Tr key={h.id} selected={h.isCurrent}>
            <Td numeric>
              {h.revision}
              {h.isCurrent ? <span className="ml-1.5 text-caption font-medium text-accent">current</span> : null}
            </Td>
            <Td className="whitespace-nowrap">{formatScanDateTime(h.createdAt)}</Td>
            <Td>{h.createdByName}</Td>
            <Td>{METHOD_LABELS[h.method]}</Td>
            <Td>
              <StatusBadge status={h.status} size="sm" />
            </Td>
            <Td muted className="text-caption">
              <span className="block min-w-56 whitespace-normal">{describeAnalysisOptions(h)}</span>
            </Td>
            <Td muted className="text-caption">
              {h.analysisVersion}
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
