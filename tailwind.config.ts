import type { Config } from "tailwindcss";

/**
 * Halfmax design tokens.
 *
 * Palette: warm "paper" greys for surfaces, a blue-black ink, and a deep iris accent.
 * Semantic tones (pass / warn / act / info) each come as a text colour (DEFAULT), a soft
 * background (`soft`) and a border (`line`). Every text colour below was checked for
 * WCAG 2.2 contrast ≥ 4.5:1 on white, on `surface-canvas` and on its own `soft` background
 * (lowest pair: ink-subtle on surface-sunken, 4.84:1). `line-control` (3.3:1 on white) is
 * the border for form controls, which need 3:1 as user-interface components (SC 1.4.11).
 *
 * Shapes: `rounded-control` for buttons and inputs, `rounded-card` for panels,
 * `rounded-chip` for badges. Type: a dense 14 px body with named steps (`text-caption` …
 * `text-display`); numbers in tables use the `tnum` utility from app/globals.css.
 */
const config = {
  content: ["./app/**/*.{ts,tsx,mdx}", "./components/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        ink: {
          DEFAULT: "#1A1F24", // 16.6:1 on white
          muted: "#4B535C", // 7.8:1 on white
          subtle: "#5F6770", // 5.7:1 on white, 4.8:1 on surface-sunken
          inverse: "#FFFFFF",
        },
        surface: {
          DEFAULT: "#FFFFFF",
          canvas: "#F4F4F0", // page background
          sunken: "#ECECE6", // table headers, wells
          hover: "#F0F0EA",
        },
        line: {
          DEFAULT: "#DADAD2", // decorative dividers and card borders
          strong: "#B5B5AB",
          control: "#8E8E84", // form control borders, 3.3:1 on white
        },
        accent: {
          DEFAULT: "#463C8C", // 9.2:1 on white; also the focus ring
          strong: "#372E73", // hover / pressed
          soft: "#ECEAF7",
          line: "#C9C4EA",
        },
        pass: { DEFAULT: "#1D6A45", soft: "#E3F1E9", line: "#A7D3BA" }, // 6.6:1 white, 5.6:1 soft
        warn: { DEFAULT: "#855000", soft: "#FBEFD9", line: "#E9C98E" }, // 6.7:1 white, 5.9:1 soft
        act: { DEFAULT: "#A12A2B", strong: "#85201F", soft: "#FBE8E6", line: "#EBB5B0" }, // 7.3:1 white, 6.2:1 soft
        info: { DEFAULT: "#255E8C", soft: "#E5EEF6", line: "#AECBE3" }, // 6.9:1 white, 5.9:1 soft
      },
      fontFamily: {
        sans: [
          "var(--font-sans)",
          "ui-sans-serif",
          "system-ui",
          "-apple-system",
          "Segoe UI",
          "Roboto",
          "Helvetica Neue",
          "Arial",
          "sans-serif",
        ],
      },
      fontSize: {
        caption: ["0.75rem", { lineHeight: "1rem", letterSpacing: "0.01em" }], // 12 px
        body: ["0.875rem", { lineHeight: "1.375rem" }], // 14 px, default text
        lead: ["1rem", { lineHeight: "1.5rem" }], // 16 px
        title: ["1.125rem", { lineHeight: "1.625rem", letterSpacing: "-0.01em" }], // 18 px, card titles
        heading: ["1.375rem", { lineHeight: "1.875rem", letterSpacing: "-0.015em" }], // 22 px, page titles
        display: ["1.75rem", { lineHeight: "2.25rem", letterSpacing: "-0.02em" }], // 28 px, key metrics
      },
      borderRadius: {
        chip: "3px",
        control: "6px",
        card: "10px",
      },
      boxShadow: {
        card: "0 1px 0 rgb(26 31 36 / 0.04), 0 1px 3px rgb(26 31 36 / 0.06)",
        raised: "0 2px 4px rgb(26 31 36 / 0.06), 0 8px 24px rgb(26 31 36 / 0.08)",
        overlay: "0 12px 32px rgb(26 31 36 / 0.18), 0 2px 6px rgb(26 31 36 / 0.08)",
        inset: "inset 0 1px 2px rgb(26 31 36 / 0.06)",
      },
      keyframes: {
        "hm-spin": { to: { transform: "rotate(360deg)" } },
        "hm-shimmer": { "0%, 100%": { opacity: "1" }, "50%": { opacity: "0.55" } },
      },
      animation: {
        "hm-spin": "hm-spin 0.8s linear infinite",
        "hm-shimmer": "hm-shimmer 1.6s ease-in-out infinite",
      },
    },
  },
} satisfies Config;

export default config;
