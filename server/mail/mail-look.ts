/**
 * Starledger's look in an e-mail: the ledger's paper, ink and brass as
 * inline styles (mail programs drop style sheets), a serif for headings and
 * a sans-serif for the rest, falling back to fonts every reader has.
 */
export const mailColours = { paper: '#f5eedc', paperDeep: '#ebe0c4', ink: '#1b2d52', inkSoft: '#4a5677', rule: '#c9b98f', brass: '#7a5718', alert: '#8a1c1c' };

const serif = "Georgia, 'Times New Roman', serif";
const sans = "'Segoe UI', Helvetica, Arial, sans-serif";

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export const mailStyle = {
  heading: `margin:24px 0 8px;font-family:${serif};font-size:18px;font-weight:600;color:${mailColours.ink};border-bottom:1px solid ${mailColours.rule};padding-bottom:4px`,
  paragraph: `margin:8px 0;font-family:${sans};font-size:14px;line-height:1.5;color:${mailColours.ink}`,
  small: `margin:8px 0;font-family:${sans};font-size:12px;line-height:1.5;color:${mailColours.inkSoft}`,
  list: `margin:4px 0 8px;padding-left:20px;font-family:${sans};font-size:14px;line-height:1.5;color:${mailColours.ink}`,
  link: `color:${mailColours.brass};text-decoration:underline`,
  button: `display:inline-block;padding:10px 18px;background:${mailColours.brass};color:${mailColours.paper};font-family:${sans};font-size:14px;font-weight:600;text-decoration:none;border-radius:3px`,
  number: 'font-variant-numeric:tabular-nums',
};

export function mailLink(href: string, text: string): string {
  return `<a href="${escapeHtml(href)}" style="${mailStyle.link}">${escapeHtml(text)}</a>`;
}

/** The page every Starledger message is drawn on: a ledger sheet with the wordmark, a title, the body and a footer line. */
export function mailPage(options: { title: string; preheader?: string; bodyHtml: string; footer: string }): string {
  const c = mailColours;
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>${escapeHtml(options.title)}</title></head>
<body style="margin:0;padding:0;background:${c.paperDeep}">
${options.preheader ? `<div style="display:none;max-height:0;overflow:hidden">${escapeHtml(options.preheader)}</div>` : ''}
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${c.paperDeep}"><tr><td align="center" style="padding:24px 12px">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:640px;background:${c.paper};border:1px solid ${c.rule};border-top:4px solid ${c.brass}">
<tr><td style="padding:20px 28px 4px">
<p style="margin:0;font-family:${serif};font-size:13px;letter-spacing:2px;text-transform:uppercase;color:${c.brass}">Starledger</p>
<h1 style="margin:6px 0 0;font-family:${serif};font-size:22px;font-weight:600;color:${c.ink}">${escapeHtml(options.title)}</h1>
</td></tr>
<tr><td style="padding:4px 28px 20px">
${options.bodyHtml}
</td></tr>
<tr><td style="padding:12px 28px 20px;border-top:1px solid ${c.rule}"><p style="${mailStyle.small}">${escapeHtml(options.footer)}</p></td></tr>
</table>
</td></tr></table>
</body></html>`;
}
