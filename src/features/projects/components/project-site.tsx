import type { Site } from '@shared/schemas/projects';
import { formatElevation, formatLatitude, formatLongitude } from '@/lib/format';

/** A site on one line: name, position, height and the local time zone. */
export function ProjectSite({ site }: { site: Site }) {
  return (
    <p className="tabular-nums">
      <span className="font-semibold text-ink">{site.name}</span>
      <span aria-hidden="true"> · </span>
      <span>
        {formatLatitude(site.latitudeDeg)}, {formatLongitude(site.longitudeDeg)}
      </span>
      <span aria-hidden="true"> · </span>
      <span>{formatElevation(site.elevationM)} above sea level</span>
      <span aria-hidden="true"> · </span>
      <span>{site.timeZone}</span>
    </p>
  );
}
