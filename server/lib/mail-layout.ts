/** The one look of every e-mail Lintel sends: our own wording goes in, plain HTML comes out. */
export const escapeHtml = (value: string) =>
  value.replace(
    /[&<>"']/g,
    (char) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[char]!,
  );

export function mailLayout(
  title: string,
  paragraphs: string[],
  action: { label: string; href: string },
  footnote: string,
): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join("");
  return `<!doctype html><html lang="en"><body style="margin:0;background:#f3f5f6;font-family:'Noto Sans',Arial,sans-serif;color:#17212b">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td align="center" style="padding:24px">
<table role="presentation" width="100%" style="max-width:560px;background:#ffffff;border-radius:12px;padding:24px" cellpadding="0" cellspacing="0"><tr><td>
<p style="margin:0 0 16px;font-weight:700;color:#1a4a4d;font-size:18px">Lintel</p>
<h1 style="margin:0 0 16px;font-size:20px">${escapeHtml(title)}</h1>
${body}
<p style="margin:24px 0"><a href="${escapeHtml(action.href)}" style="background:#1f5c5f;color:#ffffff;padding:12px 20px;border-radius:8px;text-decoration:none;font-weight:600">${escapeHtml(action.label)}</a></p>
<p style="margin:0 0 8px;font-size:13px;color:#4a5866">If the button does not work, copy this address into your browser:<br>${escapeHtml(action.href)}</p>
<p style="margin:16px 0 0;font-size:13px;color:#4a5866">${escapeHtml(footnote)}</p>
</td></tr></table></td></tr></table></body></html>`;
}
