import type { UseFormRegisterReturn } from 'react-hook-form';
import type { Site } from '@shared/schemas/projects';
import { FieldGroup, TextField } from '@/components/ui/field';

/** The site's numeric boxes: an empty one is "not given", not zero. */
const SITE_NUMBERS = [
  { name: 'latitudeDeg', label: 'Latitude (°)', hint: 'Decimal degrees, north positive.' },
  { name: 'longitudeDeg', label: 'Longitude (°)', hint: 'Decimal degrees, east positive.' },
  { name: 'elevationM', label: 'Elevation (m)', hint: 'Metres above sea level.' },
] as const;

export const SITE_NUMBER_FIELDS: ReadonlySet<keyof Site> = new Set(SITE_NUMBERS.map((n) => n.name));

/** How a form hands one site box its registration and its error; the form owns its own field paths. */
export type SiteFieldBinding = (name: keyof Site) => { registration: UseFormRegisterReturn; error?: string };

/** A project's observing site (name, time zone, latitude, longitude, elevation), as the new-project and settings forms show it. */
export function SiteFields({ bind }: { bind: SiteFieldBinding }) {
  const siteName = bind('name');
  const timeZone = bind('timeZone');
  return (
    <FieldGroup legend="Site">
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Site name" autoComplete="off" error={siteName.error} {...siteName.registration} />
        <TextField
          label="Time zone"
          autoComplete="off"
          hint="IANA name, such as America/Santiago or Etc/UTC."
          error={timeZone.error}
          {...timeZone.registration}
        />
        {SITE_NUMBERS.map(({ name, label, hint }) => {
          const { registration, error } = bind(name);
          return <TextField key={name} label={label} type="number" step="any" inputMode="decimal" hint={hint} error={error} {...registration} />;
        })}
      </div>
    </FieldGroup>
  );
}
