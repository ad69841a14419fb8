import { Callout } from "@/components/ui";
import type { DriftFlagJson } from "./scan-types";

export interface ScanWarningsProps {
  warnings: { code: string; message: string }[];
  driftFlags: DriftFlagJson[];
}

function sentence(text: string): string {
  const t = text.trim();
  if (!t) return t;
  const capital = t.charAt(0).toUpperCase() + t.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}

/** Warnings from decoding and analysis, and control-chart drift flags, each with its stable code. Server-compatible. */
export function ScanWarnings({ warnings, driftFlags }: ScanWarningsProps) {
  if (warnings.length === 0 && driftFlags.length === 0) {
    return (
      <Callout tone="success" title="No warnings">
        Decoding and analysis raised no warnings, and no drift rule fired for this result.
      </Callout>
    );
  }
  return (
    <div className="flex flex-col gap-3" data-testid="scan-warnings">
      {warnings.length > 0 ? (
        <Callout tone="caution" title={warnings.length === 1 ? "1 warning from decoding and analysis" : `${warnings.length} warnings from decoding and analysis`}>
          <ul className="mt-1 flex list-disc flex-col gap-1 pl-5">
            {warnings.map((w, i) => (
              <li key={`${w.code}-${i}`}>
                <span className="text-ink">{sentence(w.message)}</span>{" "}
                <code className="rounded-chip bg-surface-sunken px-1 text-caption text-ink-muted">{w.code}</code>
              </li>
            ))}
          </ul>
        </Callout>
      ) : null}
      {driftFlags.length > 0 ? (
        <Callout tone="caution" title="Drift against the baseline control limits">
          <ul className="mt-1 flex list-disc flex-col gap-1 pl-5">
            {driftFlags.map((f, i) => (
              <li key={`${f.rule}-${i}`}>
                <span className="text-ink">{sentence(f.description)}</span>
                {f.isBadSide === false ? <span className="text-caption"> (on the better side of the baseline)</span> : null}
              </li>
            ))}
          </ul>
        </Callout>
      ) : null}
    </div>
  );
}
