import { cn } from "./cn";

export interface SkeletonProps {
  /** Size and shape via utilities, e.g. "h-4 w-32" or "h-24 w-full rounded-card". */
  className?: string;
}

/**
 * A placeholder block that pulses gently while content loads. Purely visual (`aria-hidden`):
 * mark the loading region itself with `aria-busy="true"` or pair it with a Spinner label.
 */
export function Skeleton({ className }: SkeletonProps) {
  return (
    <span
      aria-hidden="true"
      className={cn("block h-4 w-full animate-hm-shimmer rounded-chip bg-surface-sunken", className)}
    />
  );
}

export interface SkeletonTextProps {
  /** Number of lines. Default 3; the last is shorter. */
  lines?: number;
  className?: string;
}

/** Several skeleton lines for a paragraph-shaped placeholder. */
export function SkeletonText({ lines = 3, className }: SkeletonTextProps) {
  return (
    <span aria-hidden="true" className={cn("flex flex-col gap-2", className)}>
      {Array.from({ length: lines }, (_, i) => (
        <Skeleton key={i} className={i === lines - 1 && lines > 1 ? "w-3/5" : "w-full"} />
      ))}
    </span>
  );
}
