import { useCallback, useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { HrStar } from '@shared/schemas/hr';
import { paths } from '@/config/paths';
import { StatusLine } from '@/components/ui/alert';
import { linkClasses } from '@/components/ui/button';
import { QueryError } from '@/components/errors/query-error';
import { formatCount } from '@/lib/format';
import { useHr } from '../api/get-hr';
import { HrPlot, starValues } from './hr-plot';
import type { Scene } from './hr-scene';

/** Height of the sheet's small diagram in CSS px; the sheet reserves it (with the caption) before this code arrives. */
const TARGET_HR_HEIGHT = 320;

/** A ring, a crosshair and the designation over one star, on a halo of paper so it reads over crowded points. */
function Mark({ scene, starId }: { scene: Scene; starId: number }) {
  const plotted = scene.stars.find((s) => s.star.id === starId);
  if (!plotted) return null;
  const { x, y } = plotted;
  const { left, right, top, bottom } = scene.frame;
  const toLeft = x > (left + right) / 2;
  const labelX = toLeft ? x - 14 : x + 14;
  const labelY = Math.max(top + 14, Math.min(bottom - 6, y - 10));
  return (
    <svg
      className="pointer-events-none absolute inset-0"
      width={scene.frame.width}
      height={scene.frame.height}
      aria-hidden="true"
      data-testid="hr-mark"
    >
      <g fill="none" strokeLinecap="round">
        <circle cx={x} cy={y} r={9} stroke="var(--sl-paper)" strokeWidth={5} />
        <path d={`M${x - 16} ${y}h9M${x + 7} ${y}h9M${x} ${y - 16}v9M${x} ${y + 7}v9`} stroke="var(--sl-paper)" strokeWidth={5} />
        <circle cx={x} cy={y} r={9} stroke="var(--sl-ink)" strokeWidth={2} />
        <path d={`M${x - 16} ${y}h9M${x + 7} ${y}h9M${x} ${y - 16}v9M${x} ${y + 7}v9`} stroke="var(--sl-ink)" strokeWidth={1.5} />
      </g>
      <text
        x={labelX}
        y={labelY}
        textAnchor={toLeft ? 'end' : 'start'}
        fontSize={13}
        fontWeight={600}
        fill="var(--sl-ink)"
        stroke="var(--sl-paper)"
        strokeWidth={4}
        strokeLinejoin="round"
        paintOrder="stroke"
        style={{ fontFamily: '"Source Serif 4 Variable", Georgia, serif' }}
      >
        {plotted.star.designation}
      </text>
    </svg>
  );
}

/**
 * The target sheet's small HR diagram: the project's stars as on the HR page,
 * this one ringed and named. Loaded lazily by the sheet, and only when the
 * target has a temperature and a luminosity.
 */
export default function TargetHr({
  projectId,
  targetId,
  designation,
  canSeeProposed,
}: {
  projectId: number;
  targetId: number;
  designation: string;
  canSeeProposed: boolean;
}) {
  const include = canSeeProposed ? 'proposed' : 'approved';
  const hr = useHr(projectId, include);
  const navigate = useNavigate();
  const [scene, setScene] = useState<Scene | null>(null);
  const onScene = useCallback((next: Scene) => setScene(next), []);
  const onOpen = useCallback(
    (star: HrStar) => {
      if (star.id !== targetId) void navigate(paths.project.target.getHref(projectId, star.id));
    },
    [navigate, projectId, targetId],
  );

  if (hr.isPending) return <StatusLine>Loading the diagram…</StatusLine>;
  if (hr.isError) return <QueryError what="The diagram" error={hr.error} onRetry={() => void hr.refetch()} inline />;
  const stars = hr.data.stars;
  const self = stars.find((s) => s.id === targetId);
  const values = self ? starValues(self) : null;
  const which = include === 'proposed' ? 'with the newest proposals' : 'approved values only';

  return (
    <figure className="break-inside-avoid" data-testid="target-hr">
      <HrPlot
        stars={stars}
        highlightTag={null}
        fixedHeight={TARGET_HR_HEIGHT}
        label={`HR diagram of the project, ${formatCount(stars.length, 'star')}, ${which}; ${
          self && values ? `${designation} is marked at T = ${values.temperature}, L = ${values.luminosity}.` : `${designation} is not on it.`
        }`}
        onOpen={onOpen}
        onScene={onScene}
      >
        {scene ? <Mark scene={scene} starId={targetId} /> : null}
      </HrPlot>
      <figcaption className="mt-2 text-xs text-ink-soft">
        {self && values ? (
          <span data-testid="hr-marked">
            Ringed: {designation}, T = {values.temperature}, L = {values.luminosity} ({self.temperature.status} temperature,{' '}
            {self.luminosity.status} luminosity),{' '}
          </span>
        ) : (
          <span data-testid="hr-not-marked">
            {designation} is not on the diagram: {include === 'approved' ? 'its temperature and luminosity are not both approved yet' : 'it has no temperature and luminosity yet'}.{' '}
          </span>
        )}
        among {formatCount(stars.length, 'star')} of the project ({which}).{' '}
        <Link className={linkClasses} to={paths.project.hr.getHref(projectId)} data-print="hide">
          Open the full HR diagram
        </Link>
      </figcaption>
    </figure>
  );
}
