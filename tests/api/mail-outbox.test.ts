import { afterEach, describe, expect, it } from 'vitest';
import { migrateLatest, type Db } from '../../server/db/knex';
import { openTestDb } from '../support/test-database';
import { enqueueMail } from '../../server/mail/outbox';

let db: Db | undefined;
afterEach(async () => {
  await db?.destroy();
  db = undefined;
});

const message = {
  purpose: 'weekly_summary' as const,
  idempotencyKey: 'weekly_summary:project-1:2026-W49',
  to: 'pi@test.invalid',
  subject: 'Weekly summary',
  html: '<p>Nothing new.</p>',
  text: 'Nothing new.',
};

describe('enqueueMail', () => {
  it('queues a message once however often the same key is enqueued, inside the caller’s transaction', async () => {
    db = await openTestDb();
    await migrateLatest(db);
    await db.transaction(async (trx) => {
      await enqueueMail(trx, message);
      await enqueueMail(trx, { ...message, subject: 'A second try' });
    });
    await enqueueMail(db, message);
    const rows = await db('mail_outbox').select();
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ purpose: 'weekly_summary', to: 'pi@test.invalid', subject: 'Weekly summary', status: 'queued', attempts: 0 });
  });

  it('queues nothing when the causing transaction rolls back', async () => {
    db = await openTestDb();
    await migrateLatest(db);
    await expect(
      db.transaction(async (trx) => {
        await enqueueMail(trx, message);
        throw new Error('the action failed');
      }),
    ).rejects.toThrow('the action failed');
    expect(await db('mail_outbox').count({ n: '*' }).first()).toMatchObject({ n: 0 });
  });
});
