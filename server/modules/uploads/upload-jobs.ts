import { Worker } from 'node:worker_threads';
import type { Db } from '../../db/knex';
import { AppError } from '../../lib/errors';
import { describeForLog } from '../../middleware/error-handler';
import type { ErrorCode } from '../../../shared/errors';
import type { UploadProgress } from '../../../shared/schemas/uploads';
import { runCommit, runPreview, runRemap, type CommitJob, type CommitOutcome, type PreviewJob, type RemapJob, type Report } from './upload-pipeline';

/**
 * Where the heavy upload work runs. better-sqlite3 is synchronous, so a
 * 100 000-row commit run on the request thread would stop every other
 * request for seconds; the server hands it to a worker thread with its own
 * connection (WAL lets the request thread's readers go on meanwhile). An
 * in-memory database cannot be shared with another thread, so tests run the
 * same functions in the same thread.
 */
export interface UploadJobs {
  preview(job: PreviewJob): Promise<number>;
  remap(job: RemapJob): Promise<void>;
  commit(job: CommitJob): Promise<CommitOutcome>;
  /** Where a commit under way has got to; kept a while after it ends so the page sees the last step. */
  progress(uploadId: number): UploadProgress | null;
  close(): Promise<void>;
}

const KEEP_FINISHED_MS = 5 * 60 * 1000;

/** Progress of the commits under way and lately finished, in this process. */
function progressBoard() {
  const board = new Map<number, UploadProgress>();
  const report: Report = (uploadId, p) => {
    const current = board.get(uploadId) ?? { uploadId, phase: 'queued', rowsWritten: 0, rowsTotal: 0, targetsDerived: 0, targetsTotal: 0 };
    board.set(uploadId, { ...current, ...p });
  };
  return {
    report,
    get: (uploadId: number) => board.get(uploadId) ?? null,
    finish(uploadId: number, phase: 'done' | 'failed') {
      report(uploadId, { phase });
      setTimeout(() => board.delete(uploadId), KEEP_FINISHED_MS).unref();
    },
  };
}

async function tracked<T>(board: ReturnType<typeof progressBoard>, uploadId: number, work: () => Promise<T>): Promise<T> {
  board.report(uploadId, { phase: 'queued' });
  try {
    const result = await work();
    board.finish(uploadId, 'done');
    return result;
  } catch (e) {
    board.finish(uploadId, 'failed');
    throw e;
  }
}

/** Runs the pipeline in this thread, on the app's own connection. */
export function inlineUploadJobs(db: Db): UploadJobs {
  const board = progressBoard();
  return {
    preview: (job) => runPreview(db, job),
    remap: (job) => runRemap(db, job),
    commit: (job) => tracked(board, job.uploadId, () => runCommit(db, job, board.report)),
    progress: board.get,
    close: async () => undefined,
  };
}

type Request = { id: number } & ({ type: 'preview'; job: PreviewJob } | { type: 'remap'; job: RemapJob } | { type: 'commit'; job: CommitJob });
export type WorkerRequest = Request;
export type WorkerReply =
  | { id: number; type: 'done'; result: unknown }
  | { id: number; type: 'failed'; error: SerialisedError }
  | { id: number; type: 'progress'; uploadId: number; progress: Partial<UploadProgress> };

export interface SerialisedError {
  status?: number;
  code?: string;
  message: string;
  details?: unknown;
  stack?: string;
}

export function serialiseError(e: unknown): SerialisedError {
  if (e instanceof AppError) return { status: e.status, code: e.code, message: e.message, details: e.details };
  const err = e instanceof Error ? e : new Error(String(e));
  return { message: err.message, stack: err.stack, code: (err as { code?: string }).code };
}

function reviveError(s: SerialisedError): Error {
  if (s.status) return new AppError(s.status, s.code as ErrorCode, s.message, s.details);
  const e = new Error(s.message);
  if (s.stack) e.stack = s.stack;
  if (s.code) (e as Error & { code?: string }).code = s.code;
  return e;
}

/**
 * The worker thread. In the production build esbuild makes
 * build/upload-worker.js beside build/server.js, and that file is the
 * worker. Under tsx (development, tests) the worker is this folder's
 * upload-worker.ts, which Node cannot start by itself (a worker's first
 * module is loaded before any hook), so a two-line script registers tsx in
 * the new thread first and then imports it.
 */
function startWorker(workerData: unknown): Worker {
  const here = import.meta.url;
  if (!here.endsWith('.ts')) return new Worker(new URL('./upload-worker.js', here), { workerData });
  const script = JSON.stringify(new URL('./upload-worker.ts', here).href);
  return new Worker(`import('tsx/esm/api').then((tsx) => { tsx.register(); return import(${script}); });`, { eval: true, execArgv: [], workerData });
}

/** Runs the pipeline on one worker thread with its own connection to `databaseUrl`; jobs queue there in order. */
export function workerUploadJobs(databaseUrl: string): UploadJobs {
  const board = progressBoard();
  const pending = new Map<number, { resolve: (v: unknown) => void; reject: (e: Error) => void }>();
  let nextId = 1;
  let worker: Worker | null = null;

  function start(): Worker {
    const w = startWorker({ databaseUrl });
    w.on('message', (reply: WorkerReply) => {
      if (reply.type === 'progress') return board.report(reply.uploadId, reply.progress);
      const waiting = pending.get(reply.id);
      pending.delete(reply.id);
      if (reply.type === 'done') waiting?.resolve(reply.result);
      else waiting?.reject(reviveError(reply.error));
    });
    const fail = (err: Error) => {
      for (const waiting of pending.values()) waiting.reject(err);
      pending.clear();
      if (worker === w) worker = null;
    };
    // An error nothing in the worker caught ends the thread: it is logged, the jobs waiting on it fail, and the next job starts a new one.
    w.on('error', (err) => {
      console.error('[upload worker]', describeForLog(err));
      fail(err);
    });
    w.on('exit', (code) => fail(new Error(`The upload worker stopped (exit code ${code}).`)));
    w.unref();
    return w;
  }

  function send<T>(request: Omit<Request, 'id'>, transfer: ArrayBuffer[] = []): Promise<T> {
    worker ??= start();
    const id = nextId++;
    return new Promise<T>((resolve, reject) => {
      pending.set(id, { resolve: resolve as (v: unknown) => void, reject });
      worker!.ref();
      worker!.postMessage({ ...request, id }, transfer);
    }).finally(() => {
      if (pending.size === 0) worker?.unref();
    });
  }

  return {
    preview(job) {
      // The file's bytes move to the worker rather than being copied (a copy first: multer's buffer may share its memory).
      const content = new Uint8Array(job.content);
      return send({ type: 'preview', job: { ...job, content } }, [content.buffer as ArrayBuffer]);
    },
    remap: (job) => send({ type: 'remap', job }),
    commit: (job) => tracked(board, job.uploadId, () => send<CommitOutcome>({ type: 'commit', job })),
    progress: board.get,
    async close() {
      await worker?.terminate();
      worker = null;
    },
  };
}
