import { cn } from "./cn";

const SIZES = { sm: "size-3.5", md: "size-5", lg: "size-7" } as const;

export interface SpinnerProps {
  size?: keyof typeof SIZES;
  /** Text read by screen readers. Default "Loading". */
  label?: string;
  /** Hide from assistive technology when the surrounding control already says it is busy (e.g. in a Button). */
  decorative?: boolean;
  className?: string;
}

/**
 * A quiet ring spinner in the current text colour. Standalone it is a polite `role="status"`
 * with hidden text; with `decorative` it is only an image hidden from assistive technology.
 * Under `prefers-reduced-motion` it stops turning (globals.css) and stays as a static ring.
 */
export function Spinner({ size = "md", label = "Loading", decorative = false, className }: SpinnerProps) {
  const ring = (
    <svg
      viewBox="0 0 24 24"
      fill="none"
      aria-hidden="true"
      focusable="false"
      className={cn("shrink-0 animate-hm-spin", SIZES[size], className)}
    >
      <circle cx="12" cy="12" r="9" stroke="currentColor" strokeOpacity="0.22" strokeWidth="3" />
      <path d="M21 12a9 9 0 0 0-9-9" stroke="currentColor" strokeWidth="3" strokeLinecap="round" />
    </svg>
  );
  if (decorative) return ring;
  return (
    <span role="status" className="inline-flex items-center">
      {ring}
      <span className="sr-only">{label}</span>
    </span>
  );
}
