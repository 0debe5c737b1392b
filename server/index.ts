import path from 'node:path';
import { createApp } from './app';
import { config, passwordPepper, secondFactorKey, sessionSecret } from './config';
import { createDb, DatabaseNotWritableError, migrateLatest, resolveDatabaseUrl } from './db/knex';
import { systemClock } from './lib/clock';
import { createSmtpMailer } from './mail/mailer';
import { startFakeSmtp } from './mail/fake-smtp';
import { createOutboxWorker } from './mail/outbox-worker';
import { createSummaryService } from './modules/summary/summary.service';
import { createSummaryScheduler } from './modules/summary/summary-scheduler';
import { seedDemoIfEmpty } from './db/demo';
import { createUploadsService } from './modules/uploads/uploads.service';
import { createPreviewExpiry } from './modules/uploads/preview-expiry';
import { workerUploadJobs } from './modules/uploads/upload-jobs';

async function main() {
  const db = createDb(config.databaseUrl);
  await migrateLatest(db);
  if (config.seedDemo && (await seedDemoIfEmpty(db))) console.log('Seeded the demo scenario (accounts in README.md).');
  else if (!(await db('users').first('id'))) {
    console.log('No accounts yet. Make the first site admin with: npm run admin:create -- --email you@example.org --name "Your Name" (README, First site admin).');
  }

  let smtpUrl = config.smtpUrl;
  const fake = smtpUrl ? undefined : await startFakeSmtp({ folder: path.join(config.dataDir, 'mail') });
  if (fake) {
    smtpUrl = fake.url;
    console.log(`Local mail fake on ${fake.url}; messages are kept in ${path.join(config.dataDir, 'mail')} and shown to the site admin at /admin/mail.`);
  }
  const mailer = createSmtpMailer(smtpUrl!, config.mailFrom);
  const worker = config.mailWorker ? createOutboxWorker({ db, mailer }) : undefined;
  const scheduler = config.mailWorker ? createSummaryScheduler(createSummaryService(db, systemClock, { publicUrl: config.publicUrl })) : undefined;

  // Reading and committing uploads run on a worker thread with its own connection, so a large commit holds up no request.
  const uploadJobs = workerUploadJobs(resolveDatabaseUrl(config.databaseUrl));
  const previewExpiry = createPreviewExpiry(createUploadsService(db, systemClock), { maxAgeMs: config.previewMaxAgeHours * 3_600_000 });

  const app = createApp({
    db,
    uploadJobs,
    mailer,
    sessionSecret: sessionSecret(),
    passwordPepper: passwordPepper(),
    secondFactorKey: secondFactorKey(),
    adminSecondFactor: config.adminSecondFactor,
    secureCookies: config.secureCookies,
    trustProxy: config.trustProxy,
    clientDir: config.clientDir,
    publicUrl: config.publicUrl,
    mailInbox: fake?.inbox,
    sessionLimits: { maxHours: config.sessionMaxHours, idleMinutes: config.sessionIdleMinutes },
    uploadQuotaMb: config.uploadQuotaMb,
    uploadQuotaFiles: config.uploadQuotaFiles,
  });
  const server = app.listen(config.port, config.host, () => {
    console.log(`Starledger is running: sign in at http://localhost:${config.port}/sign-in`);
    worker?.start();
    scheduler?.start();
    previewExpiry.start();
  });

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`${signal}: closing.`);
    setTimeout(() => process.exit(1), 10_000).unref();
    server.close(async () => {
      // The scheduler and worker finish the round under way first, so no claimed message is left half-sent.
      await scheduler?.stop();
      await worker?.stop();
      await previewExpiry.stop();
      await uploadJobs.close();
      await fake?.close();
      await db.destroy();
      process.exit(0);
    });
    server.closeIdleConnections();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err) => {
  // A cause the operator can fix is said in words; anything else with its stack.
  console.error(err instanceof DatabaseNotWritableError ? err.message : err);
  process.exit(1);
});
