import type { FieldValues, Path, UseFormRegister, UseFormRegisterReturn } from 'react-hook-form';
import type { Site } from '@shared/schemas/projects';
import { FieldGroup, TextField } from '@/components/ui/field';
import { toOptionalNumber } from '@/lib/form-errors';

/** The site's numeric boxes: an empty one is "not given", not zero. */
const SITE_NUMBERS = [
  { name: 'latitudeDeg', label: 'Latitude (°)', hint: 'Decimal degrees, north positive.' },
  { name: 'longitudeDeg', label: 'Longitude (°)', hint: 'Decimal degrees, east positive.' },
  { name: 'elevationM', label: 'Elevation (m)', hint: 'Metres above sea level.' },
] as const;

const SITE_NUMBER_FIELDS: ReadonlySet<keyof Site> = new Set(SITE_NUMBERS.map((n) => n.name));

/** The site's paths in a form that keeps it under `site`, for placing the server's field errors. */
export const SITE_FIELD_PATHS = ['site', 'site.name', 'site.latitudeDeg', 'site.longitudeDeg', 'site.elevationM', 'site.timeZone'] as const;

/** How a form hands one site box its registration and its error. */
export type SiteFieldBinding = (name: keyof Site) => { registration: UseFormRegisterReturn; error?: string };

/** The binding for a form whose values keep the site under `site`, as the new-project and settings forms do. */
export function bindSiteFields<T extends FieldValues & { site?: object }>(
  register: UseFormRegister<T>,
  siteErrors: Partial<Record<keyof Site, { message?: string }>> | undefined,
): SiteFieldBinding {
  return (name) => ({
    registration: register(`site.${name}` as Path<T>, SITE_NUMBER_FIELDS.has(name) ? { setValueAs: toOptionalNumber } : undefined),
    error: siteErrors?.[name]?.message,
  });
}

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
