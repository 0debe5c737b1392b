import type { UploadsService } from './uploads.service';

/**
 * Discards previews nobody committed within `maxAgeMs`, once at start and
 * then every `everyMs`, so abandoned previews do not keep their rows for
 * ever. A failed round is logged and tried again at the next tick.
 */
export function createPreviewExpiry(uploads: UploadsService, options: { maxAgeMs: number; everyMs?: number; log?: (m: string) => void }) {
  const log = options.log ?? ((m: string) => console.log(m));
  let timer: NodeJS.Timeout | undefined;
  let round: Promise<void> = Promise.resolve();
  const tick = () => {
    round = uploads.expirePreviews(options.maxAgeMs).then(
      (n) => (n > 0 ? log(`Expired ${n} preview(s) left uncommitted.`) : undefined),
      (e: unknown) => log(`Expiring previews failed: ${e instanceof Error ? e.message : String(e)}`),
    );
  };
  return {
    start() {
      tick();
      timer = setInterval(tick, options.everyMs ?? 60 * 60 * 1000);
      timer.unref();
    },
    async stop() {
      clearInterval(timer);
      await round;
    },
  };
}
