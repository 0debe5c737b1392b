import { Cron } from 'croner';
import type { SummaryService } from './summary.service';

/**
 * Looks once a minute for projects whose summary is due (each project's
 * weekday and time in its site's time zone) and queues it. Looking rather
 * than arming one timer per project means a schedule changed in any process
 * takes effect at once, and a sending missed while the server was down is
 * made up for when it comes back; the outbox key keeps it to once a week.
 */
export function createSummaryScheduler(summary: SummaryService, log: (message: string) => void = (m) => console.log(m)) {
  let job: Cron | undefined;
  let running: Promise<void> | undefined;

  async function tick(): Promise<void> {
    for (const done of await summary.enqueueDue()) log(`Weekly summary ${done.week} of project ${done.projectId} queued for ${done.queued} recipient(s).`);
  }

  return {
    tick,
    start() {
      if (job) return;
      job = new Cron('* * * * *', { protect: true, name: 'weekly-summary' }, () => {
        running = tick()
          .catch((err) => log(`Weekly summary scheduler: ${err instanceof Error ? err.message : String(err)}`))
          .finally(() => {
            running = undefined;
          });
        return running;
      });
    },
    async stop() {
      job?.stop();
      job = undefined;
      await running;
    },
  };
}
