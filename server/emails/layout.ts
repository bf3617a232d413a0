/** Escapes text for HTML e-mail bodies. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** Wraps paragraphs and one call-to-action link in our plain e-mail frame. */
export function emailHtml(paragraphs: string[], action?: { label: string; url: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join("");
  const button = action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="background:#2B3A67;color:#F7F4EE;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p><p style="font-size:12px;color:#5B6770">Or paste this address into your browser: ${escapeHtml(action.url)}</p>`
    : "";
  return `<div style="font-family:'Merriweather Sans',Arial,sans-serif;color:#1d2333;background:#F7F4EE;padding:24px"><p style="font-weight:bold;color:#2B3A67;margin:0 0 16px">Seamscene</p>${body}${button}</div>`;
}
