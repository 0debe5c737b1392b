import type { Knex } from 'knex';
import { designationKey, parseDeclination, parseRightAscension } from '../shared/coordinates';
import { hashPassword } from '../server/lib/passwords';

/**
 * The demo scenario: an invented observatory, an invented observing
 * programme and invented stars. Nothing here is a real star, person, place
 * or institution. Accounts and passwords are listed in README.md and are
 * for the demo only.
 */
export const demoAccounts = [
  { email: 'admin@demo.invalid', name: 'Orla Penhallow', password: 'admin-demo-2026', siteAdmin: true, role: null },
  { email: 'lead@demo.invalid', name: 'Tobiah Ferrand', password: 'lead-demo-2026', siteAdmin: false, role: 'lead' },
  { email: 'observer@demo.invalid', name: 'Mireille Castaway', password: 'observer-demo-2026', siteAdmin: false, role: 'observer' },
  { email: 'reader@demo.invalid', name: 'Jun Aldenmoor', password: 'reader-demo-2026', siteAdmin: false, role: 'reader' },
  { email: 'pi@demo.invalid', name: 'Hesper Quillon', password: 'pi-demo-2026', siteAdmin: false, role: 'pi' },
] as const;

export const demoProject = {
  code: 'GLASSWING',
  name: 'Glasswing Nearby Dwarfs Programme',
  description:
    'A season-long characterisation of two dozen nearby field stars: effective temperatures from colours and spectra, ' +
    'luminosities from parallaxes, and radii for the lab’s spectroscopic-parallax checks.',
  site: { name: 'Brackenfell Ridge Observatory', latitudeDeg: -29.417, longitudeDeg: 21.883, elevationM: 1412, timeZone: 'Africa/Johannesburg' },
};

/** Invented designations (the programme's own "GW" numbers) at invented positions, with the observers' notes. */
export const demoTargets: { designation: string; ra: string; dec: string; tags: string[]; notes: string }[] = [
  ['GW 101', '00 12 41.7', '-12 44 08', ['dwarf', 'priority'], 'Bright comparison star for the season.'],
  ['GW 102', '00 58 13.2', '+04 21 55', ['dwarf'], ''],
  ['GW 103', '01 47 29.9', '-33 05 12', ['dwarf'], ''],
  ['GW 104', '02 31 06.4', '-05 49 37', ['giant-candidate'], 'Colour and parallax disagree on class; re-observe.'],
  ['GW 105', '03 19 52.8', '+11 02 44', ['dwarf'], ''],
  ['GW 106', '04 02 17.5', '-21 38 19', ['hot'], 'Early-type; colour temperature saturates, use the spectrum.'],
  ['GW 107', '04 55 38.1', '-08 12 05', ['dwarf', 'priority'], ''],
  ['GW 108', '05 14 32.3', '+06 58 41', ['dwarf'], ''],
  ['GW 109', '06 08 44.0', '-40 17 26', ['cool'], 'M dwarf; Wien peak lies in the near infrared.'],
  ['GW 110', '06 51 09.6', '-17 25 53', ['dwarf'], ''],
  ['GW 111', '07 36 27.3', '+02 14 30', ['dwarf'], ''],
  ['GW 112', '08 22 15.8', '-26 49 02', ['giant-candidate'], ''],
  ['GW 113', '09 04 50.1', '-11 30 47', ['dwarf'], ''],
  ['GW 114', '09 49 33.7', '+08 36 12', ['dwarf'], ''],
  ['GW 115', '10 33 18.2', '-35 52 39', ['hot'], ''],
  ['GW 116', '11 17 02.9', '-03 07 58', ['dwarf'], ''],
  ['GW 117', '12 01 46.4', '-19 41 21', ['cool'], ''],
  ['GW 118', '12 46 29.0', '+13 18 06', ['dwarf'], ''],
  ['GW 119', '13 31 12.6', '-28 03 33', ['dwarf'], ''],
  ['GW 120', '14 15 57.3', '-09 55 14', ['white-dwarf-candidate'], 'Faint and blue for its parallax.'],
  ['GW 121', '15 00 41.9', '+01 29 49', ['dwarf'], ''],
  ['GW 122', '15 45 25.5', '-44 16 27', ['dwarf'], ''],
  ['GW 123', '16 30 10.2', '-14 38 52', ['dwarf', 'priority'], ''],
  ['GW 124', '17 14 54.8', '-23 02 10', ['cool'], ''],
].map(([designation, ra, dec, tags, notes]) => ({
  designation: designation as string,
  ra: ra as string,
  dec: dec as string,
  tags: tags as string[],
  notes: notes as string,
}));

function degrees(result: { ok: true; degrees: number } | { ok: false; message: string }): number {
  if (!result.ok) throw new Error(result.message);
  return result.degrees;
}

export async function seed(knex: Knex): Promise<void> {
  const now = new Date().toISOString();
  const hashes = await Promise.all(demoAccounts.map((a) => hashPassword(a.password)));
  await knex.transaction(async (trx) => {
    const userIds: number[] = [];
    for (const [i, a] of demoAccounts.entries()) {
      const [row] = await trx('users')
        .insert({ email: a.email, name: a.name, password_hash: hashes[i], is_site_admin: a.siteAdmin, created_at: now, updated_at: now })
        .returning('id');
      userIds.push(typeof row === 'object' ? row.id : row);
    }
    const [projectRow] = await trx('projects')
      .insert({
        code: demoProject.code,
        name: demoProject.name,
        description: demoProject.description,
        site_name: demoProject.site.name,
        site_latitude_deg: demoProject.site.latitudeDeg,
        site_longitude_deg: demoProject.site.longitudeDeg,
        site_elevation_m: demoProject.site.elevationM,
        site_time_zone: demoProject.site.timeZone,
        created_at: now,
        updated_at: now,
      })
      .returning('id');
    const projectId = typeof projectRow === 'object' ? projectRow.id : projectRow;
    await trx('project_members').insert(
      demoAccounts.flatMap((a, i) => (a.role ? [{ project_id: projectId, user_id: userIds[i], role: a.role, added_at: now }] : [])),
    );
    await trx('targets').insert(
      demoTargets.map((t) => ({
        project_id: projectId,
        designation: t.designation,
        designation_key: designationKey(t.designation),
        ra_deg: degrees(parseRightAscension(t.ra)),
        dec_deg: degrees(parseDeclination(t.dec)),
        notes: t.notes,
        tags: JSON.stringify(t.tags),
        created_at: now,
        updated_at: now,
      })),
    );
  });
}
