import fs from 'node:fs';
import os from 'node:os';
import { parentPort, workerData } from 'node:worker_threads';
import { createDb } from '../../db/knex';
import { runCommit, runPreview, runRemap } from './upload-pipeline';
import { serialiseError, type WorkerReply, type WorkerRequest } from './upload-jobs';

/**
 * The upload worker thread: its own connection to the same database, one job
 * at a time (SQLite has one writer anyway), replies and progress posted back
 * to the request thread.
 */
/**
 * On Linux a thread has its own nice value: this one yields the CPU to the
 * request thread, so on a busy machine readers are served first and the
 * commit takes what is left. Elsewhere the thread keeps the normal priority.
 */
function yieldToRequests() {
  try {
    const tid = Number(fs.readlinkSync('/proc/thread-self').split('/').pop());
    if (tid > 0) os.setPriority(tid, 10);
  } catch {
    // No /proc (not Linux) or no right to change it: normal priority.
  }
}

yieldToRequests();
const db = createDb((workerData as { databaseUrl: string }).databaseUrl);
const port = parentPort!;
const reply = (message: WorkerReply) => port.postMessage(message);

let queue: Promise<void> = Promise.resolve();

port.on('message', (request: WorkerRequest) => {
  queue = queue.then(async () => {
    try {
      const result =
        request.type === 'preview'
          ? await runPreview(db, request.job)
          : request.type === 'remap'
            ? await runRemap(db, request.job)
            : await runCommit(db, request.job, (uploadId, progress) => reply({ id: request.id, type: 'progress', uploadId, progress }));
      reply({ id: request.id, type: 'done', result: result ?? null });
    } catch (e) {
      reply({ id: request.id, type: 'failed', error: serialiseError(e) });
    }
  });
});
