import { Link } from 'react-router-dom';
import type { Project } from '@shared/schemas/projects';
import { paths } from '@/config/paths';
import { linkClasses } from '@/components/ui/button';
import { formatCount } from '@/lib/format';

/**
 * How many proposed values wait for the lead astronomer in each project, for
 * the people who read the review queue (the server sends no count to the
 * others). Nothing is drawn for someone who reads no queue.
 */
export function AwaitingReview({ projects }: { projects: Project[] }) {
  const queues = projects.filter((p) => p.awaitingReview !== null);
  if (queues.length === 0) return null;
  const waiting = queues.filter((p) => (p.awaitingReview ?? 0) > 0);
  if (waiting.length === 0) return <p className="text-sm text-ink-soft">No values await review in your projects.</p>;
  return (
    <ul className="space-y-1.5 text-sm" aria-label="Values awaiting review, by project">
      {waiting.map((p) => (
        <li key={p.id} className="flex flex-wrap items-baseline gap-x-2">
          <span className="text-xs font-semibold tracking-wider text-brass-deep">{p.code}</span>
          <Link to={paths.project.review.getHref(p.id)} className={`${linkClasses} font-semibold tabular-nums`}>
            {formatCount(p.awaitingReview ?? 0, 'value')} awaiting review
          </Link>
          <span className="text-ink-soft">in {p.name}</span>
        </li>
      ))}
    </ul>
  );
}
