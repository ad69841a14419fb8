import type { ResultStatus } from "./qa-types";

/** Chart colours: the design tokens' hex values (SVG cannot read Tailwind classes). */
export const TREND_COLOURS = {
  pass: "#1D6A45",
  warning: "#855000",
  action: "#A12A2B",
  "no-baseline": "#5F6770",
  warnZone: "#FBEFD9",
  actZone: "#FBE8E6",
  baseline: "#1A1F24",
  control: "#5F6770",
  line: "#B5B5AB",
  grid: "#DADAD2",
  axis: "#4B535C",
  service: "#255E8C",
  alert: "#A12A2B",
} as const;

export const STATUS_ORDER: readonly ResultStatus[] = ["pass", "warning", "action", "no-baseline"];

/** Shape names used in the legend, so the text says what the eye sees. */
export const MARKER_SHAPE_NAMES: Record<ResultStatus, string> = {
  pass: "filled circle",
  warning: "diamond",
  action: "square",
  "no-baseline": "hollow circle",
};

/**
 * One result marker, centred on (cx, cy): shape AND colour carry the status (the same shapes as the status
 * badges' icons: circle = pass, diamond = warning, square = action, hollow dashed-like circle = not evaluated).
 */
export function TrendMarker({ status, cx, cy, size = 5 }: { status: ResultStatus; cx: number; cy: number; size?: number }) {
  const c = TREND_COLOURS[status];
  switch (status) {
    case "pass":
      return <circle cx={cx} cy={cy} r={size * 0.9} fill={c} stroke="#fff" strokeWidth={1} />;
    case "warning":
      return <path d={`M${cx} ${cy - size * 1.25}L${cx + size * 1.25} ${cy}L${cx} ${cy + size * 1.25}L${cx - size * 1.25} ${cy}Z`} fill={c} stroke="#fff" strokeWidth={1} />;
    case "action":
      return <rect x={cx - size} y={cy - size} width={size * 2} height={size * 2} fill={c} stroke="#fff" strokeWidth={1} />;
    default:
      return <circle cx={cx} cy={cy} r={size * 0.85} fill="#fff" stroke={c} strokeWidth={1.6} />;
  }
}

/** A 16 × 16 legend sample of a marker. */
export function MarkerSwatch({ status }: { status: ResultStatus }) {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="size-4 shrink-0">
      <TrendMarker status={status} cx={8} cy={8} size={5} />
    </svg>
  );
}

/** A 24 × 12 legend sample of a line. */
export function LineSwatch({ colour, dash, width = 1.6 }: { colour: string; dash?: string; width?: number }) {
  return (
    <svg viewBox="0 0 24 12" aria-hidden="true" focusable="false" className="h-3 w-6 shrink-0">
      <path d="M1 6h22" stroke={colour} strokeWidth={width} strokeDasharray={dash} strokeLinecap="butt" />
    </svg>
  );
}

/** A legend sample of a shaded zone. */
export function ZoneSwatch({ fill, edge }: { fill: string; edge: string }) {
  return (
    <svg viewBox="0 0 16 12" aria-hidden="true" focusable="false" className="h-3 w-4 shrink-0">
      <rect x={0.5} y={0.5} width={15} height={11} fill={fill} stroke={edge} strokeWidth={1} strokeDasharray="3 2" />
    </svg>
  );
}

/** Marker glyph of a service visit (a small flag above the plot) and of an alert event (a small triangle). */
export function EventGlyph({ kind, x, y }: { kind: "service" | "alert"; x: number; y: number }) {
  if (kind === "service") {
    return (
      <g>
        <rect x={x - 6} y={y - 6} width={12} height={12} rx={2} fill={TREND_COLOURS.service} />
        <path d={`M${x - 3} ${y + 3}L${x + 3} ${y - 3}M${x + 1} ${y - 3}h2v2`} stroke="#fff" strokeWidth={1.5} fill="none" strokeLinecap="round" />
      </g>
    );
  }
  return (
    <g>
      <path d={`M${x} ${y - 6}L${x + 6.5} ${y + 5.5}H${x - 6.5}Z`} fill={TREND_COLOURS.alert} />
      <path d={`M${x} ${y - 2}v3.6`} stroke="#fff" strokeWidth={1.5} strokeLinecap="round" />
      <circle cx={x} cy={y + 3.6} r={0.9} fill="#fff" />
    </g>
  );
}

export function EventSwatch({ kind }: { kind: "service" | "alert" }) {
  return (
    <svg viewBox="0 0 16 16" aria-hidden="true" focusable="false" className="size-4 shrink-0">
      <EventGlyph kind={kind} x={8} y={8} />
    </svg>
  );
}
