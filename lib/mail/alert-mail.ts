import { escapeHtml, layoutHtml, type RenderedMail } from "./templates";

export interface AlertMailInput {
  recipientName: string;
  scannerName: string;
  siteName: string;
  testName: string;
  cause: "action" | "warning" | "overdue" | "drift";
  change: "opened" | "updated";
  summary: string;
  metrics: { label: string; value: string; baseline: string; levels: string; status: string }[];
  link: string;
}

const CAUSE_TITLE = {
  action: "Action level reached",
  warning: "Warning level reached",
  overdue: "Resolution test overdue",
  drift: "Drift before failure (advisory)",
} as const;

/** The e-mail sent to a scanner's engineers and physicist when an alert opens or repeats. */
export function alertMail(a: AlertMailInput): RenderedMail {
  const title = `${CAUSE_TITLE[a.cause]}: ${a.scannerName} (${a.siteName})`;
  const subject = `[Halfmax] ${a.change === "updated" ? "Again — " : ""}${title}`;
  const what = a.change === "opened" ? "A new alert was opened." : "An open alert was raised again by a newer result.";
  const rows = a.metrics.map((m) => `  ${m.label}: ${m.value} (baseline ${m.baseline}; ${m.levels}) — ${m.status}`).join("\n");
  const text = `Hello ${a.recipientName},

${what}

Scanner: ${a.scannerName}
Site:    ${a.siteName}
Test:    ${a.testName}
${a.summary}
${rows ? `\n${rows}\n` : ""}
Open the result: ${a.link}

Results support, and never replace, the judgement of the qualified medical physicist.
`;
  const table = a.metrics.length
    ? `<table style="border-collapse:collapse;margin:12px 0"><tr>${["Metric", "Value", "Baseline", "Levels", "Status"].map((h) => `<th style="text-align:left;padding:4px 8px;border-bottom:1px solid #ccc">${h}</th>`).join("")}</tr>${a.metrics
        .map((m) => `<tr>${[m.label, m.value, m.baseline, m.levels, m.status].map((c) => `<td style="padding:4px 8px">${escapeHtml(c)}</td>`).join("")}</tr>`)
        .join("")}</table>`
    : "";
  const html = layoutHtml(
    title,
    `<p>Hello ${escapeHtml(a.recipientName)},</p><p>${escapeHtml(what)}</p>
<p><strong>Scanner:</strong> ${escapeHtml(a.scannerName)}<br><strong>Site:</strong> ${escapeHtml(a.siteName)}<br><strong>Test:</strong> ${escapeHtml(a.testName)}</p>
<p>${escapeHtml(a.summary)}</p>${table}<p><a href="${escapeHtml(a.link)}">Open the result in Halfmax</a></p>`,
  );
  return { subject, text, html };
}
