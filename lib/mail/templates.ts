/** Plain-text + HTML e-mail bodies. Every message carries both parts and a link back into Halfmax. */

export function escapeHtml(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

export interface RenderedMail {
  subject: string;
  text: string;
  html: string;
}

export function layoutHtml(title: string, bodyHtml: string): string {
  return `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#102a33;max-width:640px">
<h2 style="margin:0 0 12px">${escapeHtml(title)}</h2>${bodyHtml}
<p style="color:#4a5f66;font-size:12px;margin-top:24px">Sent by Halfmax, the resolution-QA workbench. Results support, and never replace, the judgement of the qualified medical physicist.</p>
</body></html>`;
}

export function invitationMail(input: { name: string; inviterName: string; link: string; expiresHours: number }): RenderedMail {
  const subject = "Your Halfmax account";
  const text = `Hello ${input.name},

${input.inviterName} created a Halfmax account for you. Choose your password here (the link works for ${input.expiresHours} hours):

${input.link}
`;
  const html = layoutHtml(
    subject,
    `<p>Hello ${escapeHtml(input.name)},</p><p>${escapeHtml(input.inviterName)} created a Halfmax account for you.</p>
<p><a href="${escapeHtml(input.link)}">Choose your password</a> (the link works for ${input.expiresHours} hours).</p>`,
  );
  return { subject, text, html };
}

export function passwordResetMail(input: { name: string; link: string; expiresHours: number }): RenderedMail {
  const subject = "Reset your Halfmax password";
  const text = `Hello ${input.name},

Someone (hopefully you) asked to reset your Halfmax password. Choose a new one here (valid for ${input.expiresHours} hours):

${input.link}

If you did not ask for this, ignore this message.
`;
  const html = layoutHtml(
    subject,
    `<p>Hello ${escapeHtml(input.name)},</p><p>Someone (hopefully you) asked to reset your Halfmax password.</p>
<p><a href="${escapeHtml(input.link)}">Choose a new password</a> (valid for ${input.expiresHours} hours).</p><p>If you did not ask for this, ignore this message.</p>`,
  );
  return { subject, text, html };
}
