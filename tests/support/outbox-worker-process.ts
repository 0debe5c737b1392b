/**
 * One outbox worker in a process of its own, for the test that two server
 * processes on one database deliver each message once. Arguments: database
 * URL, SMTP URL, worker id, and the instant (ms since 1970) at which to
 * begin, so that two processes started together race. Runs rounds until a few in a row find nothing
 * due, then prints what it sent as JSON.
 */
import { createDb } from '../../server/db/knex';
import { createSmtpMailer } from '../../server/mail/mailer';
import { createOutboxWorker } from '../../server/mail/outbox-worker';

const [databaseUrl, smtpUrl, workerId, startAt] = process.argv.slice(2);
const db = createDb(databaseUrl);
const worker = createOutboxWorker({ db, mailer: createSmtpMailer(smtpUrl, 'starledger@localhost'), workerId, batchSize: 5, log: () => undefined });
await new Promise((resolve) => setTimeout(resolve, Math.max(0, Number(startAt) - Date.now())));
let sent = 0;
let idle = 0;
while (idle < 3) {
  const round = await worker.runOnce();
  sent += round.sent;
  idle = round.sent + round.retried + round.failed === 0 ? idle + 1 : 0;
  await new Promise((resolve) => setTimeout(resolve, 20));
}
await db.destroy();
process.stdout.write(JSON.stringify({ workerId, sent }));
