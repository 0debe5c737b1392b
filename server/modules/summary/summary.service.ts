import type { Db } from '../../db/knex';
import type { Clock } from '../../lib/clock';
import { notFound } from '../../lib/errors';
import { enqueueMail } from '../../mail/outbox';
import { crossChecks, newestStanding } from '../../../shared/physics/cross-checks';
import type { SendSummaryResult, SummaryPreview, SummarySchedule, SummarySettings } from '../../../shared/schemas/mail';
import { roleCan, type ProjectRole } from '../../../shared/schemas/roles';
import { appendTrail } from '../trail/trail.repository';
import { byTarget, isEmpty, quantityName, summaryHtml, summarySubject, summaryText, valueWords, warningWords, type WeeklySummaryContent } from './summary-mail';
import { isoWeek, lastSummaryRun, nextSummaryRun } from './summary-schedule';
import {
  awaitingReview,
  decisionsInPeriod,
  derivedInPeriod,
  findSummaryProject,
  listScheduledProjects,
  queuedKeys,
  standingValues,
  summaryRecipients,
  updateSchedule,
  uploadsCommitted,
  weekQueuedAt,
  type SummaryProject,
} from './summary.repository';

const WEEK_MS = 7 * 24 * 3600 * 1000;
/** A scheduled sending missed while no server ran is made up for within this time, and not later (a summary on Thursday for Monday would surprise). */
const CATCH_UP_MS = 6 * 3600 * 1000;

/** Readers see approved values only (PRODUCT.md, roles), in the summary as on the sheet. */
type Audience = 'full' | 'approved';
const audienceOf = (role: ProjectRole): Audience => (roleCan(role, 'readProposed') ? 'full' : 'approved');

export function summaryKeyPrefix(projectId: number, week: string): string {
  return `weekly_summary:${projectId}:${week}:`;
}

export function createSummaryService(db: Db, clock: Clock, options: { publicUrl: string }) {
  const base = options.publicUrl.replace(/\/+$/, '');
  const targetHref = (projectId: number) => (targetId: number) => `${base}/projects/${projectId}/targets/${targetId}`;

  async function requireProject(projectId: number): Promise<SummaryProject> {
    const project = await findSummaryProject(db, projectId);
    if (!project) throw notFound('No such project.');
    return project;
  }

  function periodText(project: SummaryProject, since: Date, until: Date): string {
    const day = new Intl.DateTimeFormat('en-GB', { timeZone: project.timeZone, day: 'numeric', month: 'short' });
    const full = new Intl.DateTimeFormat('en-GB', { timeZone: project.timeZone, day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', hour12: false });
    return `${day.format(since)} – ${full.format(until)} (${project.timeZone})`;
  }

  /** Everything the week brought, for one audience. */
  async function content(project: SummaryProject, until: Date, audience: Audience): Promise<WeeklySummaryContent> {
    const since = new Date(until.getTime() - WEEK_MS);
    const [s, u] = [since.toISOString(), until.toISOString()];
    const href = targetHref(project.id);
    const full = audience === 'full';
    const uploads = await uploadsCommitted(db, project.id, s, u);
    const decisions = await decisionsInPeriod(db, project.id, s, u);
    const awaiting = full ? await awaitingReview(db, project.id) : [];
    const derived = (await derivedInPeriod(db, project.id, s, u)).filter((v) => full || v.status === 'approved');
    const touched = [...new Set([...derived.map((v) => v.targetId), ...decisions.approved.map((v) => v.targetId)])];
    const standing = (await standingValues(db, touched)).filter((v) => full || v.status === 'approved');
    const failedChecks = touched.flatMap((targetId) => {
      const values = newestStanding(standing.filter((v) => v.targetId === targetId));
      const disagreeing = crossChecks(values).filter((c) => c.verdict === 'disagree');
      if (disagreeing.length === 0) return [];
      return [{ targetId, designation: values[0].designation, href: href(targetId), items: disagreeing.map((c) => c.text), count: disagreeing.length }];
    });
    failedChecks.sort((a, b) => a.designation.localeCompare(b.designation, 'en', { numeric: true }));
    return {
      projectName: project.name,
      projectCode: project.code,
      week: isoWeek(until, project.timeZone),
      periodText: periodText(project, since, until),
      projectHref: `${base}/projects/${project.id}`,
      reviewHref: full && awaiting.length > 0 ? `${base}/projects/${project.id}/review` : null,
      uploads: uploads.map((up) => ({
        ...up,
        href: `${base}/projects/${project.id}/uploads/${up.id}`,
        targetLinks: up.targets.map((t) => ({ designation: t.designation, href: href(t.id) })),
      })),
      approved: byTarget(decisions.approved, href, valueWords, 3),
      rejected: full ? byTarget(decisions.rejected, href, (v) => `${valueWords(v)}${v.note ? ` (“${v.note}”)` : ''}`) : [],
      awaiting: byTarget(awaiting, href, (v) => quantityName(v.quantity), 3),
      warnings: byTarget(
        derived.filter((v) => v.warnings.length > 0),
        href,
        (v) => warningWords(v).join('; '),
      ),
      failedChecks,
    };
  }

  function render(c: WeeklySummaryContent) {
    return { subject: summarySubject(c), html: summaryHtml(c), text: summaryText(c) };
  }

  /**
   * Queues the week's summary for every recipient who has not had it yet,
   * in one transaction; the key (project, ISO week, person) makes a week's
   * summary go out once however often this runs, in however many processes.
   * Only the messages this call queued are counted and named in the trail,
   * so of two processes racing for one week the one that lost says nothing.
   */
  async function enqueueWeek(project: SummaryProject, week: string, now: Date, actorUserId: number | null): Promise<SendSummaryResult> {
    const recipients = await summaryRecipients(db, project.id);
    const prefix = summaryKeyPrefix(project.id, week);
    const already = await queuedKeys(
      db,
      recipients.map((r) => `${prefix}${r.userId}`),
    );
    const due = recipients.filter((r) => !already.has(`${prefix}${r.userId}`));
    if (due.length === 0) return { week, queued: 0, alreadyQueued: already.size };
    const rendered = new Map<Audience, ReturnType<typeof render>>();
    for (const audience of new Set(due.map((r) => audienceOf(r.role)))) rendered.set(audience, render(await content(project, now, audience)));
    const queued = await db.transaction(async (trx) => {
      const mine: string[] = [];
      // In one order in every process, so two racing for the same keys wait for each other rather than deadlock.
      for (const r of [...due].sort((a, b) => a.userId - b.userId)) {
        const mail = rendered.get(audienceOf(r.role))!;
        if (await enqueueMail(trx, { purpose: 'weekly_summary', idempotencyKey: `${prefix}${r.userId}`, to: r.email, ...mail }, now)) mine.push(r.email);
      }
      if (actorUserId !== null && mine.length > 0) {
        await appendTrail(
          trx,
          { projectId: project.id, actorUserId, action: 'summary.sent_now', entityType: 'project', entityId: project.id, after: { week, recipients: mine } },
          now,
        );
      }
      return mine.length;
    });
    return { week, queued, alreadyQueued: recipients.length - queued };
  }

async function settings(projectId: number): Promise<SummarySettings> {
    const project = await requireProject(projectId);
    const now = clock.now();
    const week = isoWeek(now, project.timeZone);
    const next = nextSummaryRun(project.schedule, project.timeZone, now);
    return {
      schedule: project.schedule,
      timeZone: project.timeZone,
      nextRunAt: next ? next.toISOString() : null,
      recipients: (await summaryRecipients(db, projectId)).map((r) => ({ name: r.name, email: r.email, reason: r.reason })),
      week,
      weekQueuedAt: await weekQueuedAt(db, summaryKeyPrefix(projectId, week)),
    };
  }

  return {
    /** The summary as it would go out now to a PI (everything the week brought). */
    async preview(projectId: number): Promise<SummaryPreview> {
      const project = await requireProject(projectId);
      const now = clock.now();
      const c = await content(project, now, 'full');
      return { week: c.week, periodStart: new Date(now.getTime() - WEEK_MS).toISOString(), periodEnd: now.toISOString(), ...render(c), empty: isEmpty(c) };
    },

    settings,

    async updateSchedule(projectId: number, actorUserId: number, schedule: SummarySchedule): Promise<SummarySettings> {
      const project = await requireProject(projectId);
      const now = clock.now();
      await db.transaction(async (trx) => {
        await updateSchedule(trx, projectId, schedule, now);
        await appendTrail(trx, { projectId, actorUserId, action: 'summary.schedule_changed', entityType: 'project', entityId: projectId, before: project.schedule, after: schedule }, now);
      });
      return settings(projectId);
    },

    /** "Send now": this ISO week's summary, to whoever has not had it. */
    async sendNow(projectId: number, actorUserId: number): Promise<SendSummaryResult> {
      const project = await requireProject(projectId);
      const now = clock.now();
      return enqueueWeek(project, isoWeek(now, project.timeZone), now, actorUserId);
    },

    /**
     * What the scheduler calls every minute: every project whose scheduled
     * moment has passed (within the catch-up window) gets that week's
     * summary queued, once.
     */
    async enqueueDue(): Promise<{ projectId: number; week: string; queued: number }[]> {
      const now = clock.now();
      const done: { projectId: number; week: string; queued: number }[] = [];
      for (const project of await listScheduledProjects(db)) {
        const last = lastSummaryRun(project.schedule, project.timeZone, now);
        if (!last || now.getTime() - last.getTime() > CATCH_UP_MS) continue;
        const week = isoWeek(last, project.timeZone);
        const result = await enqueueWeek(project, week, now, null);
        if (result.queued > 0) done.push({ projectId: project.id, week, queued: result.queued });
      }
      return done;
    },
  };
}

export type SummaryService = ReturnType<typeof createSummaryService>;
