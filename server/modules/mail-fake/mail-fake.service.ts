import { notFound } from '../../lib/errors';
import type { MailInbox } from '../../mail/fake-smtp';
import type { CaughtMail, CaughtMailSummary } from '../../../shared/schemas/mail';

const ABSENT = 'There is no mail fake: mail goes to the SMTP server named by SMTP_URL.';

/** The site admin's view of what the local mail fake caught; absent (404) when real SMTP is configured. */
export function createMailFakeService(inbox: MailInbox | undefined) {
  function require(): MailInbox {
    if (!inbox) throw notFound(ABSENT);
    return inbox;
  }
  return {
    list(): CaughtMailSummary[] {
      return require()
        .messages()
        .reverse()
        .map((m) => ({ id: m.id, from: m.from, to: m.to, subject: m.subject, receivedAt: m.receivedAt, hasHtml: m.html !== null }));
    },
    get(id: number): CaughtMail {
      const m = require().find(id);
      if (!m) throw notFound(`No caught message ${id}.`);
      return { id: m.id, from: m.from, to: m.to, subject: m.subject, receivedAt: m.receivedAt, hasHtml: m.html !== null, text: m.text, html: m.html };
    },
  };
}

export type MailFakeService = ReturnType<typeof createMailFakeService>;
