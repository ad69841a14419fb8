import { formatDate, formatValue } from "@/components/scanners/qa-format";

export interface MtfSparklineProps {
  /** MTF50 in cycles/mm, oldest first. */
  points: { at: string; value: number }[];
  width?: number;
  height?: number;
}

/** Words for screen readers: what the little line shows. */
export function sparklineText(points: MtfSparklineProps["points"]): string {
  if (points.length === 0) return "No MTF50 results in the past year";
  const first = points[0]!;
  const last = points[points.length - 1]!;
  if (points.length === 1) return `One MTF50 result: ${formatValue("mtf50", last.value)} cycles/mm on ${formatDate(last.at)}`;
  const values = points.map((p) => p.value);
  return (
    `MTF50 over the last ${points.length} results: ${formatValue("mtf50", first.value)} cycles/mm on ${formatDate(first.at)}, ` +
    `${formatValue("mtf50", last.value)} cycles/mm on ${formatDate(last.at)} (range ${formatValue("mtf50", Math.min(...values))}–${formatValue("mtf50", Math.max(...values))})`
  );
}

/**
 * A tiny MTF50 trend line (inline SVG, no axes): hidden from assistive technology, with the same information as
 * text beside it. The y range is the points' own range, so it shows the shape of the trend, not its size.
 */
export function MtfSparkline({ points, width = 80, height = 26 }: MtfSparklineProps) {
  const text = sparklineText(points);
  if (points.length === 0) {
    return (
      <span className="text-caption text-ink-subtle">
        <span aria-hidden="true">—</span>
        <span className="sr-only">{text}</span>
      </span>
    );
  }
  const pad = 3;
  const values = points.map((p) => p.value);
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const span = hi - lo || Math.abs(hi) * 0.05 || 1;
  const x = (i: number) => (points.length === 1 ? width / 2 : pad + (i * (width - 2 * pad)) / (points.length - 1));
  const y = (v: number) => (hi === lo ? height / 2 : pad + ((hi - v) * (height - 2 * pad)) / span);
  const path = points.map((p, i) => `${i === 0 ? "M" : "L"}${x(i).toFixed(1)},${y(p.value).toFixed(1)}`).join(" ");
  const last = points[points.length - 1]!;
  return (
    <span className="inline-flex items-center" title={text}>
      <svg width={width} height={height} viewBox={`0 0 ${width} ${height}`} aria-hidden="true" focusable="false" className="overflow-visible text-accent">
        <path d={path} fill="none" stroke="currentColor" strokeWidth={1.4} strokeLinejoin="round" strokeLinecap="round" />
        <circle cx={x(points.length - 1)} cy={y(last.value)} r={2.2} fill="currentColor" />
      </svg>
      <span className="sr-only">{text}</span>
    </span>
  );
}
