import { cn } from "@/components/ui/cn";

/** "Active" / inactive wording as a small chip; the words carry the meaning, colour only supports them. */
export function ActiveChip({ active, inactiveLabel = "Deactivated" }: { active: boolean; inactiveLabel?: string }) {
  return (
    <span
      className={cn(
        "inline-flex h-6 items-center rounded-chip border px-2 text-caption font-medium whitespace-nowrap",
        active ? "border-pass-line bg-pass-soft text-pass" : "border-line-strong bg-surface-sunken text-ink-muted",
      )}
    >
      {active ? "Active" : inactiveLabel}
    </span>
  );
}
