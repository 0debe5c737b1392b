import fs from 'node:fs';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export interface CaughtMessage {
  id: number;
  from: string;
  to: string[];
  subject: string;
  text: string;
  /** The HTML part as sent, or null for a text-only message. */
  html: string | null;
  receivedAt: string;
}

/** What the local mail fake caught, newest last; read by the site admin's mail page and by tests. */
export interface MailInbox {
  messages(): CaughtMessage[];
  find(id: number): CaughtMessage | undefined;
  add(message: Omit<CaughtMessage, 'id'>): CaughtMessage;
}

export function createMailInbox(): MailInbox {
  const caught: CaughtMessage[] = [];
  return {
    messages: () => [...caught],
    find: (id) => caught.find((m) => m.id === id),
    add(message) {
      const stored = { id: caught.length + 1, ...message };
      caught.push(stored);
      return stored;
    },
  };
}

/**
 * A local SMTP server that accepts every message on loopback, keeps it in
 * the inbox and, when given a folder, writes it there as an .eml file, so
 * development, the demo and tests never send real mail.
 */
export async function startFakeSmtp(options: { port?: number; folder?: string; inbox?: MailInbox } = {}) {
  const inbox = options.inbox ?? createMailInbox();
  if (options.folder) fs.mkdirSync(options.folder, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((mail) => {
            const to = [mail.to].flat().flatMap((a) => (a ? a.value.map((v) => v.address ?? '') : []));
            const receivedAt = new Date().toISOString();
            const stored = inbox.add({
              from: mail.from?.text ?? '',
              to,
              subject: mail.subject ?? '',
              text: mail.text ?? '',
              html: typeof mail.html === 'string' ? mail.html : null,
              receivedAt,
            });
            if (options.folder) fs.writeFileSync(path.join(options.folder, `${receivedAt.replace(/[:.]/g, '-')}-${stored.id}.eml`), raw);
            callback();
          })
          .catch((err: Error) => callback(err));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    port,
    url: `smtp://127.0.0.1:${port}`,
    inbox,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

export type FakeSmtp = Awaited<ReturnType<typeof startFakeSmtp>>;
