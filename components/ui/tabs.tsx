"use client";

import { createContext, useCallback, useContext, useId, useState, type KeyboardEvent, type ReactNode } from "react";
import { cn } from "./cn";

interface TabsContextValue {
  baseId: string;
  value: string;
  select: (value: string) => void;
  activation: "automatic" | "manual";
}

const TabsContext = createContext<TabsContextValue | null>(null);

function useTabs(component: string): TabsContextValue {
  const context = useContext(TabsContext);
  if (!context) throw new Error(`<${component}> must be inside <Tabs>`);
  return context;
}

const safe = (value: string) => value.replace(/[^a-zA-Z0-9_-]/g, "_");
const tabId = (baseId: string, value: string) => `${baseId}-tab-${safe(value)}`;
const panelId = (baseId: string, value: string) => `${baseId}-panel-${safe(value)}`;

export interface TabsProps {
  /** Initially selected tab (uncontrolled). Give this or `value`: with neither, no tab is reachable by keyboard. */
  defaultValue?: string;
  /** Selected tab (controlled); pair with onValueChange. */
  value?: string;
  onValueChange?: (value: string) => void;
  /**
   * `automatic` (default): arrow keys select as they move — right for panels already rendered.
   * `manual`: arrows only move focus, Enter/Space selects — for panels that are costly to show.
   */
  activation?: "automatic" | "manual";
  className?: string;
  children: ReactNode;
}

/**
 * Accessible tabs (WAI-ARIA APG tabs pattern): roving tabindex, ←/→ (wrapping), Home/End.
 * ```tsx
 * <Tabs defaultValue="mtf">
 *   <TabList label="Result views"><Tab value="mtf">MTF</Tab><Tab value="lsf">LSF</Tab></TabList>
 *   <TabPanel value="mtf">…</TabPanel><TabPanel value="lsf">…</TabPanel>
 * </Tabs>
 * ```
 */
export function Tabs({ defaultValue = "", value, onValueChange, activation = "automatic", className, children }: TabsProps) {
  const baseId = useId().replace(/[^a-zA-Z0-9_-]/g, "");
  const [inner, setInner] = useState(defaultValue);
  const current = value ?? inner;
  const select = useCallback(
    (next: string) => {
      if (value === undefined) setInner(next);
      onValueChange?.(next);
    },
    [value, onValueChange],
  );
  return (
    <TabsContext.Provider value={{ baseId: `tabs${baseId}`, value: current, select, activation }}>
      <div className={cn("flex min-w-0 flex-col", className)}>{children}</div>
    </TabsContext.Provider>
  );
}

export interface TabListProps {
  /** Accessible name of the tab set, e.g. "Result views". */
  label: string;
  className?: string;
  children: ReactNode;
}

export function TabList({ label, className, children }: TabListProps) {
  const { select, activation } = useTabs("TabList");
  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const tabs = Array.from(event.currentTarget.querySelectorAll<HTMLButtonElement>('[role="tab"]:not([disabled])'));
    const index = tabs.indexOf(document.activeElement as HTMLButtonElement);
    if (index < 0 || tabs.length === 0) return;
    let next: number | null = null;
    if (event.key === "ArrowRight") next = (index + 1) % tabs.length;
    else if (event.key === "ArrowLeft") next = (index - 1 + tabs.length) % tabs.length;
    else if (event.key === "Home") next = 0;
    else if (event.key === "End") next = tabs.length - 1;
    if (next === null) return;
    event.preventDefault();
    const target = tabs[next];
    target.focus();
    if (activation === "automatic" && target.dataset.value !== undefined) select(target.dataset.value);
  };
  return (
    <div
      role="tablist"
      aria-label={label}
      aria-orientation="horizontal"
      onKeyDown={onKeyDown}
      className={cn("flex gap-1 overflow-x-auto border-b border-line", className)}
    >
      {children}
    </div>
  );
}

export interface TabProps {
  value: string;
  disabled?: boolean;
  className?: string;
  children: ReactNode;
}

export function Tab({ value, disabled = false, className, children }: TabProps) {
  const { baseId, value: current, select } = useTabs("Tab");
  const selected = current === value;
  return (
    <button
      type="button"
      role="tab"
      id={tabId(baseId, value)}
      aria-controls={panelId(baseId, value)}
      aria-selected={selected}
      tabIndex={selected ? 0 : -1}
      disabled={disabled}
      data-value={value}
      onClick={() => select(value)}
      className={cn(
        "relative -mb-px inline-flex h-9 shrink-0 items-center gap-1.5 rounded-t-control px-3 text-body font-medium whitespace-nowrap",
        "border-b-2 transition-colors duration-150 focus-visible:-outline-offset-2",
        selected ? "border-accent text-ink" : "border-transparent text-ink-muted hover:border-line-strong hover:text-ink",
        "disabled:cursor-not-allowed disabled:opacity-50",
        className,
      )}
    >
      {children}
    </button>
  );
}

export interface TabPanelProps {
  value: string;
  /** Keep the panel in the DOM while hidden (default true: preserves chart and form state). */
  keepMounted?: boolean;
  className?: string;
  children: ReactNode;
}

export function TabPanel({ value, keepMounted = true, className, children }: TabPanelProps) {
  const { baseId, value: current } = useTabs("TabPanel");
  const selected = current === value;
  if (!selected && !keepMounted) return null;
  return (
    <div
      role="tabpanel"
      id={panelId(baseId, value)}
      aria-labelledby={tabId(baseId, value)}
      hidden={!selected}
      tabIndex={0}
      className={cn("pt-4 focus-visible:outline-offset-4", className)}
    >
      {children}
    </div>
  );
}
