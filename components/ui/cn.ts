/** A class value: strings are kept, falsy values dropped, arrays flattened. */
export type ClassValue = string | number | false | null | undefined | readonly ClassValue[];

/**
 * Joins class names, skipping falsy values: `cn("a", cond && "b", ["c"])` → "a b c".
 *
 * It does not resolve Tailwind conflicts (no tailwind-merge): a caller's `className` is appended
 * last but wins only where the CSS order allows, so use it for layout (margins, widths, grid
 * placement), not to restyle colours or sizes — pick a variant instead.
 */
export function cn(...values: ClassValue[]): string {
  const out: string[] = [];
  const visit = (value: ClassValue): void => {
    if (value === false || value === null || value === undefined || value === "") return;
    if (Array.isArray(value)) {
      for (const item of value as readonly ClassValue[]) visit(item);
      return;
    }
    out.push(String(value));
  };
  for (const value of values) visit(value);
  return out.join(" ");
}
