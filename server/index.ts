import path from 'node:path';
import { createApp } from './app';
import { config, sessionSecret } from './config';
import { createDb, migrateLatest } from './db/knex';
import { createSmtpMailer } from './mail/mailer';
import { startFakeSmtp } from './mail/fake-smtp';
import { seedDemoIfEmpty } from './db/demo';

async function main() {
  const db = createDb(config.databaseUrl);
  await migrateLatest(db);
  if (config.seedDemo && (await seedDemoIfEmpty(db))) console.log('Seeded the demo scenario (accounts in README.md).');

  let smtpUrl = config.smtpUrl;
  const fake = smtpUrl ? undefined : await startFakeSmtp({ folder: path.join(config.dataDir, 'mail') });
  if (fake) {
    smtpUrl = fake.url;
    console.log(`Local mail fake on ${fake.url}; messages are kept in ${path.join(config.dataDir, 'mail')}.`);
  }
  const mailer = createSmtpMailer(smtpUrl!, config.mailFrom);

  const app = createApp({ db, mailer, sessionSecret: sessionSecret(), secureCookies: config.secureCookies, clientDir: config.clientDir });
  const server = app.listen(config.port, config.host, () => {
    console.log(`Starledger is running: sign in at http://localhost:${config.port}/sign-in`);
  });

  const shutdown = (signal: string) => {
    console.log(`${signal}: closing.`);
    server.close(async () => {
      await fake?.close();
      await db.destroy();
      process.exit(0);
    });
    setTimeout(() => process.exit(1), 10_000).unref();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
