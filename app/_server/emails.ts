import "server-only";
import type { OutgoingMail } from "./mail";

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (ch) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[ch]!);
}

/** One shared, plain layout for every message: a heading, a few paragraphs and one clear button. */
export function composeMail(input: {
  to: string;
  subject: string;
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footnote?: string;
}): OutgoingMail {
  const textParts = [input.heading, "", ...input.paragraphs.flatMap((p) => [p, ""])];
  if (input.action) textParts.push(`${input.action.label}: ${input.action.url}`, "");
  if (input.footnote) textParts.push(input.footnote, "");
  textParts.push("— Chalkline");

  const button = input.action
    ? `<p style="margin:24px 0"><a href="${escapeHtml(input.action.url)}" style="background:#2f6f66;color:#ffffff;padding:10px 18px;border-radius:8px;text-decoration:none;font-weight:600">${escapeHtml(input.action.label)}</a></p>
<p style="font-size:13px;color:#686e78">Or paste this address into your browser:<br><span style="word-break:break-all">${escapeHtml(input.action.url)}</span></p>`
    : "";
  const html = `<!doctype html><html><body style="margin:0;background:#f6f3ec;font-family:Helvetica,Arial,sans-serif;color:#23262b">
<div style="max-width:560px;margin:0 auto;padding:32px 24px">
<p style="font-weight:700;letter-spacing:0.04em;color:#2f6f66;margin:0 0 24px">CHALKLINE</p>
<h1 style="font-size:22px;margin:0 0 16px">${escapeHtml(input.heading)}</h1>
${input.paragraphs.map((p) => `<p style="line-height:1.5;margin:0 0 12px">${escapeHtml(p)}</p>`).join("\n")}
${button}
${input.footnote ? `<p style="font-size:13px;color:#686e78;margin-top:24px">${escapeHtml(input.footnote)}</p>` : ""}
</div></body></html>`;
  return { to: input.to, subject: input.subject, text: textParts.join("\n"), html };
}
