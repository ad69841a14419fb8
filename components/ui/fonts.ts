import localFont from "next/font/local";

/**
 * Inter (variable weight 100–900, Latin subset), self-hosted from fonts/ — no network at build
 * or run time. Licence: SIL OFL 1.1, see fonts/LICENSE-inter.txt.
 *
 * Use in the root layout: `<html className={sans.variable}>`; Tailwind's `font-sans`
 * (tailwind.config.ts) reads `var(--font-sans)`. The `src` path is relative to this file.
 */
export const sans = localFont({
  src: "../../fonts/inter-latin-wght-normal.woff2",
  weight: "100 900",
  style: "normal",
  variable: "--font-sans",
  display: "swap",
  fallback: ["ui-sans-serif", "system-ui", "Segoe UI", "Roboto", "Arial", "sans-serif"],
});
