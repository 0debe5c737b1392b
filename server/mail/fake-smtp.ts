import fs from 'node:fs';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export interface CaughtMessage {
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

/**
 * A local SMTP server that accepts every message on loopback, keeps it in
 * memory and, when given a folder, writes it there as an .eml file, so
 * development, the demo and tests never send real mail.
 */
export async function startFakeSmtp(options: { port?: number; folder?: string } = {}) {
  const inbox: CaughtMessage[] = [];
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
            inbox.push({ to, subject: mail.subject ?? '', text: mail.text ?? '', receivedAt });
            if (options.folder) fs.writeFileSync(path.join(options.folder, `${receivedAt.replace(/[:.]/g, '-')}.eml`), raw);
            callback();
          })
          .catch((err: Error) => callback(err));
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(options.port ?? 0, '127.0.0.1', resolve));
  const { port } = server.server.address() as AddressInfo;
  return {
    port,
    url: `smtp://127.0.0.1:${port}`,
    inbox,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
