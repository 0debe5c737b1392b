import { escapeHtml, mailLink, mailPage, mailStyle } from './mail-look';

export interface LinkMail {
  subject: string;
  title: string;
  /** Paragraphs before the button, plain text (escaped for the HTML part). */
  paragraphs: string[];
  action: string;
  href: string;
  /** When the link stops working, in words ("until 9 Dec 2026, 03:00 UTC"). */
  validity: string;
  /** Why the reader receives this, and what to do if it was not meant for them. */
  footer: string;
}

/** When a link in a message stops working, written out in UTC (the mail cannot know the reader's zone). */
export function untilWords(at: Date): string {
  const f = new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hour12: false });
  return `until ${f.format(at)} UTC`;
}

/** A message whose point is one single-use link (an invitation, a password reset), as HTML and as plain text. */
export function linkMail(mail: LinkMail): { subject: string; html: string; text: string } {
  const once = `The link works once, ${mail.validity}.`;
  const text = [...mail.paragraphs.flatMap((p) => [p, '']), `${mail.action}:`, mail.href, '', once, '', '--', mail.footer, ''].join('\n');
  const html = mailPage({
    title: mail.title,
    preheader: mail.paragraphs[0],
    bodyHtml:
      mail.paragraphs.map((p) => `<p style="${mailStyle.paragraph}">${escapeHtml(p)}</p>`).join('') +
      `<p style="margin:20px 0"><a href="${escapeHtml(mail.href)}" style="${mailStyle.button}">${escapeHtml(mail.action)}</a></p>` +
      `<p style="${mailStyle.small}">${escapeHtml(once)} If the button does not open, copy this address into your browser: ${mailLink(mail.href, mail.href)}</p>`,
    footer: mail.footer,
  });
  return { subject: mail.subject, html, text };
}
