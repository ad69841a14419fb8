"use client";

import { useId } from "react";
import { Input, cn } from "@/components/ui";
import { isoDay } from "./qa-format";

export type RangePreset = "3m" | "1y" | "all" | "custom";

/** A test-date range: "YYYY-MM-DD" days (UTC), "" = open end. */
export interface DateRange {
  preset: RangePreset;
  from: string;
  to: string;
}

export const PRESET_LABELS: Record<Exclude<RangePreset, "custom">, string> = { "3m": "3 months", "1y": "1 year", all: "All" };

/** The range of a preset, counted back from today (UTC). */
export function presetRange(preset: Exclude<RangePreset, "custom">, now = new Date()): DateRange {
  if (preset === "all") return { preset, from: "", to: "" };
  const start = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - (preset === "3m" ? 3 : 12), now.getUTCDate()));
  return { preset, from: isoDay(start), to: "" };
}

/** `?from=…&to=…` for the API (empty ends left out). */
export function rangeQuery(range: DateRange): string {
  const p = new URLSearchParams();
  if (range.from) p.set("from", range.from);
  if (range.to) p.set("to", range.to);
  const q = p.toString();
  return q ? `?${q}` : "";
}

/** "since 3 Sep 2026", "1 Jan – 31 Mar 2026", "all results". */
export function describeRange(range: DateRange): string {
  const fmt = (d: string) => new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" }).format(new Date(`${d}T00:00:00Z`));
  if (range.from && range.to) return `${fmt(range.from)} – ${fmt(range.to)}`;
  if (range.from) return `since ${fmt(range.from)}`;
  if (range.to) return `up to ${fmt(range.to)}`;
  return "all results";
}

/** Presets (a segmented button group) plus from/to date inputs; typing a date switches to a custom range. */
export function DateRangePicker({ value, onChange, className }: { value: DateRange; onChange: (range: DateRange) => void; className?: string }) {
  const fromId = useId();
  const toId = useId();
  const invalid = Boolean(value.from && value.to && value.from > value.to);
  return (
    <div className={cn("flex flex-wrap items-end gap-3", className)}>
      <fieldset className="flex flex-col gap-1">
        <legend className="mb-1 text-caption font-medium text-ink-muted">Period</legend>
        <div className="inline-flex rounded-control border border-line-control bg-surface shadow-card" role="group">
          {(Object.keys(PRESET_LABELS) as (keyof typeof PRESET_LABELS)[]).map((p, i) => (
            <button
              key={p}
              type="button"
              aria-pressed={value.preset === p}
              onClick={() => onChange(presetRange(p))}
              className={cn(
                "h-8 px-3 text-body font-medium",
                i > 0 && "border-l border-line-control",
                i === 0 && "rounded-l-control",
                i === 2 && "rounded-r-control",
                value.preset === p ? "bg-accent text-ink-inverse" : "text-ink hover:bg-surface-hover",
              )}
            >
              {PRESET_LABELS[p]}
            </button>
          ))}
        </div>
      </fieldset>
      <div className="flex flex-col gap-1">
        <label htmlFor={fromId} className="text-caption font-medium text-ink-muted">From</label>
        <Input
          id={fromId}
          type="date"
          controlSize="sm"
          className="w-40"
          value={value.from}
          max={value.to || undefined}
          onChange={(e) => onChange({ preset: "custom", from: e.target.value, to: value.to })}
        />
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={toId} className="text-caption font-medium text-ink-muted">To</label>
        <Input
          id={toId}
          type="date"
          controlSize="sm"
          className="w-40"
          value={value.to}
          min={value.from || undefined}
          aria-invalid={invalid || undefined}
          onChange={(e) => onChange({ preset: "custom", from: value.from, to: e.target.value })}
        />
      </div>
      {invalid ? <p className="pb-1.5 text-caption font-medium text-act" role="alert">The start date is after the end date.</p> : null}
    </div>
  );
}
