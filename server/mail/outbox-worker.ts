import crypto from 'node:crypto';
import os from 'node:os';
import type { Db } from '../db/knex';
import type { Clock } from '../lib/clock';
import { systemClock } from '../lib/clock';
import type { Mailer } from './mailer';

export interface OutboxWorkerOptions {
  db: Db;
  mailer: Mailer;
  clock?: Clock;
  /** Names this process in `claimed_by`; unique per process by default. */
  workerId?: string;
  pollIntervalMs?: number;
  batchSize?: number;
  /** After this many failed attempts a message is marked failed and left for a person to look at. */
  maxAttempts?: number;
  /** A 'sending' claim older than this is taken to be a process that died mid-send, and the message is claimed again. */
  claimTimeoutMs?: number;
  /** Back-off before attempt n+1 after n failures: base·2^(n−1), capped. */
  retryBaseMs?: number;
  retryMaxMs?: number;
  log?: (message: string) => void;
}

interface ClaimedRow {
  id: number;
  to: string;
  subject: string;
  html: string;
  text: string;
  attempts: number;
}

export interface DeliveryRound {
  sent: number;
  retried: number;
  failed: number;
}

export function retryDelayMs(failures: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, failures - 1));
}

/**
 * Delivers the outbox. A message is claimed before it is sent by a
 * compare-and-set on its status and attempt count inside a transaction, so
 * of several processes on one database exactly one takes it; it is marked
 * sent only after the SMTP server accepted it, and otherwise goes back to
 * the queue with exponential back-off and its error recorded. A process that
 * dies between the claim and the mark leaves a stale claim that another
 * round takes again after `claimTimeoutMs` (the one window in which a
 * message can go out twice: SMTP accepted it and the mark was never
 * written).
 */
export function createOutboxWorker(options: OutboxWorkerOptions) {
  const { db, mailer } = options;
  const clock = options.clock ?? systemClock;
  const workerId = options.workerId ?? `${os.hostname()}:${process.pid}:${crypto.randomBytes(3).toString('hex')}`;
  const pollIntervalMs = options.pollIntervalMs ?? 2_000;
  const batchSize = options.batchSize ?? 20;
  const maxAttempts = options.maxAttempts ?? 10;
  const claimTimeoutMs = options.claimTimeoutMs ?? 5 * 60_000;
  const retryBaseMs = options.retryBaseMs ?? 30_000;
  const retryMaxMs = options.retryMaxMs ?? 60 * 60_000;
  const log = options.log ?? ((m: string) => console.log(m));

  async function claim(now: Date): Promise<ClaimedRow[]> {
    const at = now.toISOString();
    const staleBefore = new Date(now.getTime() - claimTimeoutMs).toISOString();
    // Read the candidates outside the transaction, so that the transaction
    // begins with a write: on SQLite a transaction that read first and then
    // writes after another process wrote fails at once instead of waiting.
    const due: { id: number; status: string; attempts: number }[] = await db('mail_outbox')
      .where((q) => q.where('status', 'queued').andWhere('next_attempt_at', '<=', at))
      .orWhere((q) => q.where('status', 'sending').andWhere('claimed_at', '<', staleBefore))
      .orderBy('next_attempt_at')
      .orderBy('id')
      .limit(batchSize)
      .select('id', 'status', 'attempts');
    if (due.length === 0) return [];
    return db.transaction(async (trx): Promise<ClaimedRow[]> => {
      const claimed: number[] = [];
      for (const row of due) {
        const n = await trx('mail_outbox')
          .where({ id: row.id, status: row.status, attempts: row.attempts })
          .update({ status: 'sending', attempts: row.attempts + 1, claimed_by: workerId, claimed_at: at });
        if (n === 1) claimed.push(row.id);
      }
      if (claimed.length === 0) return [];
      return trx('mail_outbox').whereIn('id', claimed).andWhere('claimed_by', workerId).orderBy('id').select('id', 'to', 'subject', 'html', 'text', 'attempts');
    });
  }

  async function deliver(row: ClaimedRow): Promise<'sent' | 'retried' | 'failed'> {
    const mine = { id: row.id, status: 'sending', claimed_by: workerId, attempts: row.attempts };
    try {
      await mailer.send({ to: row.to, subject: row.subject, text: row.text, html: row.html });
    } catch (err) {
      const error = err instanceof Error ? err.message : String(err);
      const failed = row.attempts >= maxAttempts;
      const next = new Date(clock.now().getTime() + retryDelayMs(row.attempts, retryBaseMs, retryMaxMs));
      await db('mail_outbox')
        .where(mine)
        .update({ status: failed ? 'failed' : 'queued', last_error: error.slice(0, 2000), next_attempt_at: next.toISOString(), claimed_by: null, claimed_at: null });
      log(`Mail ${row.id} to ${row.to}: attempt ${row.attempts} failed (${error})${failed ? '; giving up' : `; next try at ${next.toISOString()}`}.`);
      return failed ? 'failed' : 'retried';
    }
    const marked = await db('mail_outbox').where(mine).update({ status: 'sent', sent_at: clock.now().toISOString(), last_error: null });
    if (marked !== 1) log(`Mail ${row.id} was sent, but its claim had been taken over meanwhile (the send outlasted the claim timeout).`);
    return 'sent';
  }

  /** One round: claim what is due and deliver it, one message after another. */
  async function runOnce(): Promise<DeliveryRound> {
    const round: DeliveryRound = { sent: 0, retried: 0, failed: 0 };
    for (const row of await claim(clock.now())) round[await deliver(row)] += 1;
    return round;
  }

  let timer: NodeJS.Timeout | undefined;
  let running: Promise<unknown> | undefined;
  let stopped = true;

  function schedule() {
    if (stopped) return;
    timer = setTimeout(() => {
      running = runOnce()
        .catch((err) => log(`Mail worker round failed: ${err instanceof Error ? err.message : String(err)}`))
        .finally(() => {
          running = undefined;
          schedule();
        });
    }, pollIntervalMs);
  }

  return {
    workerId,
    runOnce,
    start() {
      if (!stopped) return;
      stopped = false;
      schedule();
    },
    /** Stops polling and waits for a round under way to finish, so no claim is left half-done at shutdown. */
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await running;
    },
  };
}

export type OutboxWorker = ReturnType<typeof createOutboxWorker>;
