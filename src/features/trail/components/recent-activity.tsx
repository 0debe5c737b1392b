import { Link } from 'react-router-dom';
import type { ActivityEntry } from '@shared/schemas/trail';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { StatusLine } from '@/components/ui/alert';
import { QueryError } from '@/components/errors/query-error';
import { EmptyState } from '@/components/ui/empty-state';
import { quantityName } from '@/lib/derived-words';
import { formatDateTime } from '@/lib/format';
import { cn } from '@/lib/cn';
import { useActivity } from '../api/get-activity';
import { actionWords } from '../trail-words';

/** A text field recorded in the entry's after (or else before), such as a value's quantity or an upload's file name. */
const recorded = (e: ActivityEntry, key: string): string | null => {
  for (const side of [e.after, e.before]) {
    if (typeof side === 'object' && side !== null && key in side) {
      const v = (side as Record<string, unknown>)[key];
      if (typeof v === 'string' && v !== '') return v;
    }
  }
  return null;
};

function ActivityLine({ entry }: { entry: ActivityEntry }) {
  const quantity = entry.entityType === 'derived_value' ? recorded(entry, 'quantity') : null;
  const file = entry.entityType === 'upload' ? recorded(entry, 'filename') : null;
  const projectId = entry.projectId;
  return (
    <li className="grid gap-x-4 gap-y-0.5 border-b border-rule py-2 text-sm sm:grid-cols-[8.5rem_1fr]">
      {/* The section says the times are UTC, so each line need not. */}
      <time dateTime={entry.createdAt} className="whitespace-nowrap text-ink-soft tabular-nums">
        {formatDateTime(entry.createdAt).replace(' UTC', '')}
      </time>
      <p className="min-w-0">
        {projectId !== null && entry.projectCode ? (
          <Link
            to={paths.project.trail.getHref(projectId)}
            className="mr-2 text-xs font-semibold tracking-[0.14em] text-brass-deep uppercase underline-offset-4 hover:underline"
            aria-label={`${entry.projectCode}: open its review trail`}
          >
            {entry.projectCode}
          </Link>
        ) : null}
        <span>{entry.actor?.name ?? 'The system'}</span>
        {' · '}
        <span className="font-semibold">{actionWords(entry.action)}</span>
        {quantity ? <span> · {quantityName(quantity)}</span> : null}
        {file ? <span> · {file}</span> : null}
        {entry.targetId !== null && projectId !== null ? (
          <>
            {' · '}
            {entry.action === 'target.deleted' ? (
              <span>{entry.targetDesignation ?? `Target ${entry.targetId}`}</span>
            ) : (
              <Link to={paths.project.target.getHref(projectId, entry.targetId)} className={cn(linkClasses, 'font-semibold')}>
                {entry.targetDesignation ?? `Target ${entry.targetId}`}
              </Link>
            )}
          </>
        ) : null}
        {entry.note ? <span className="block text-ink-soft">“{entry.note}”</span> : null}
      </p>
    </li>
  );
}

/**
 * The newest entries of the review trail across the person's projects, for
 * the home page. Projects in which the person is a reader are left out: the
 * trail carries values the lead has not approved.
 */
export function RecentActivity({ limit = 12 }: { limit?: number }) {
  const activity = useActivity(limit);
  if (activity.isPending) return <StatusLine>Loading recent activity…</StatusLine>;
  if (activity.isError) return <QueryError what="Recent activity" error={activity.error} onRetry={() => void activity.refetch()} inline />;
  if (activity.data.length === 0) {
    return (
      <EmptyState title="Nothing recorded yet">
        Changes to targets, uploads, values and members appear here from the projects in which you are an observer, the lead astronomer or the
        PI. A reader’s projects are not listed.
      </EmptyState>
    );
  }
  return (
    <ol aria-label="Recent activity, newest first" className="border-t border-rule">
      {activity.data.map((e) => (
        <ActivityLine key={e.id} entry={e} />
      ))}
    </ol>
  );
}
