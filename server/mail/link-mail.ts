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

/** A moment written out in UTC (the mail cannot know the reader's zone): "9 Dec 2026, 03:00 UTC". */
export function utcWords(at: Date): string {
  const f = new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hour12: false });
  return `${f.format(at)} UTC`;
}

/** When a link in a message stops working, written out in UTC. */
export function untilWords(at: Date): string {
  return `until ${utcWords(at)}`;
}

interface ParagraphsMail {
  subject: string;
  title: string;
  /** Plain text (escaped for the HTML part); the first is also the preview line. */
  paragraphs: string[];
  /** Why the reader receives this, and what to do if it was not meant for them. */
  footer: string;
}

/** Paragraphs, then what follows them (as text lines and as HTML), then the footer, on Starledger's mail page. */
function paragraphsMail(mail: ParagraphsMail, after: { text: string[]; html: string }): { subject: string; html: string; text: string } {
  const text = [...mail.paragraphs.flatMap((p) => [p, '']), ...after.text, '--', mail.footer, ''].join('\n');
  const html = mailPage({
    title: mail.title,
    preheader: mail.paragraphs[0],
    bodyHtml: mail.paragraphs.map((p) => `<p style="${mailStyle.paragraph}">${escapeHtml(p)}</p>`).join('') + after.html,
    footer: mail.footer,
  });
  return { subject: mail.subject, html, text };
}

/** A message whose point is one single-use link (an invitation, a password reset), as HTML and as plain text. */
export function linkMail(mail: LinkMail): { subject: string; html: string; text: string } {
  const once = `The link works once, ${mail.validity}.`;
  return paragraphsMail(mail, {
    text: [`${mail.action}:`, mail.href, '', once, ''],
    html:
      `<p style="margin:20px 0"><a href="${escapeHtml(mail.href)}" style="${mailStyle.button}">${escapeHtml(mail.action)}</a></p>` +
      `<p style="${mailStyle.small}">${escapeHtml(once)} If the button does not open, copy this address into your browser: ${mailLink(mail.href, mail.href)}</p>`,
  });
}

/** A message that tells the reader something has happened, with an address to go to about it, as HTML and as plain text. */
export function noticeMail(mail: ParagraphsMail & { where: { words: string; href: string } }): { subject: string; html: string; text: string } {
  return paragraphsMail(mail, {
    text: [`${mail.where.words}:`, mail.where.href, ''],
    html: `<p style="${mailStyle.paragraph}">${escapeHtml(mail.where.words)}: ${mailLink(mail.where.href, mail.where.href)}</p>`,
  });
}
