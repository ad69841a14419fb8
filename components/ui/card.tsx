import type { ComponentPropsWithoutRef, ReactNode } from "react";
import { cn } from "./cn";

export interface CardProps extends ComponentPropsWithoutRef<"section"> {
  /** Element to render: a `section` (default, give it `aria-labelledby` to the title's id) or a plain `div`. */
  as?: "section" | "div" | "article";
  /** `sunken`: a flat well on the canvas colour (no shadow), for secondary groupings. */
  tone?: "default" | "sunken";
}

/** A bordered panel. Compose with CardHeader, CardTitle, CardDescription, CardBody, CardFooter. */
export function Card({ as: Tag = "section", tone = "default", className, ...rest }: CardProps) {
  return (
    <Tag
      {...rest}
      className={cn(
        "flex min-w-0 flex-col rounded-card border border-line",
        tone === "sunken" ? "bg-surface-canvas" : "bg-surface shadow-card",
        className,
      )}
    />
  );
}

export interface CardHeaderProps extends Omit<ComponentPropsWithoutRef<"div">, "title"> {
  /** Right-aligned controls (buttons, a select). */
  actions?: ReactNode;
}

/** Title row of a card; put CardTitle (and CardDescription) inside. */
export function CardHeader({ actions, className, children, ...rest }: CardHeaderProps) {
  return (
    <div {...rest} className={cn("flex flex-wrap items-start justify-between gap-x-4 gap-y-2 border-b border-line px-4 py-3", className)}>
      <div className="flex min-w-0 flex-col gap-0.5">{children}</div>
      {actions ? <div className="flex shrink-0 items-center gap-2">{actions}</div> : null}
    </div>
  );
}

export interface CardTitleProps extends ComponentPropsWithoutRef<"h2"> {
  /** Heading level to keep the page outline right. Default h2. */
  as?: "h2" | "h3" | "h4";
}

export function CardTitle({ as: Tag = "h2", className, ...rest }: CardTitleProps) {
  return <Tag {...rest} className={cn("text-title font-semibold text-ink", className)} />;
}

export function CardDescription({ className, ...rest }: ComponentPropsWithoutRef<"p">) {
  return <p {...rest} className={cn("text-body text-ink-muted", className)} />;
}

export interface CardBodyProps extends ComponentPropsWithoutRef<"div"> {
  /** No padding: for tables and charts that run to the card's edges. */
  flush?: boolean;
}

export function CardBody({ flush = false, className, ...rest }: CardBodyProps) {
  return <div {...rest} className={cn("min-w-0 flex-1", flush ? "" : "p-4", className)} />;
}

export function CardFooter({ className, ...rest }: ComponentPropsWithoutRef<"div">) {
  return (
    <div
      {...rest}
      className={cn("flex flex-wrap items-center justify-end gap-2 rounded-b-card border-t border-line bg-surface-canvas px-4 py-3", className)}
    />
  );
}
