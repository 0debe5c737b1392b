/**
 * The floor for `npm run bench:api`: what the 50-row target list costs with
 * no framework around its SQL. Plain Express and better-sqlite3 on the
 * bench database, each statement prepared once: the token's owner, the
 * caller's membership, the project's count, the page of targets with their
 * proposal counts, and the page's stored values, answered as the same JSON
 * document the API gives (the newest shown revision per quantity). No
 * session, CSRF, validation, query builder or pool. Started by
 * scripts/bench-api.ts as `node scripts/bench-api-floor.mjs PORT DATABASE_FILE`.
 */
import { createHash } from 'node:crypto';
import Database from 'better-sqlite3';
import express from 'express';

const [port, file] = process.argv.slice(2);
const db = new Database(file, { readonly: true, fileMustExist: true });
db.pragma('cache_size = -65536');

const PAGE = 50;
const SHOWN = ['approved', 'proposed'];
const SOURCES = { temperature: ['temperature'], spectral_class: ['spectral_class'], luminosity: ['luminosity'], radius: ['radius'], distance: ['distance_parallax', 'distance_photometric'] };
const STORED = [...new Set(Object.values(SOURCES).flat())];

const owner = db.prepare('select u.id, u.email, u.name, u.is_site_admin from api_tokens k join users u on u.id = k.user_id where k.token_hash = ? and k.revoked_at is null');
const member = db.prepare('select role from project_members where project_id = ? and user_id = ?');
const count = db.prepare('select target_count as n from projects where id = ?');
const page = db.prepare(
  `select t.*, (select count(*) from derived_values w where w.target_id = t.id and w.status = 'proposed') as awaiting_review
     from targets t where t.project_id = ? order by t.designation_key, t.id limit ${PAGE} offset ?`,
);
const valuesOf = db.prepare(
  `select target_id, quantity, revision, value, uncertainty, interval_low, interval_high, unit, label, status from derived_values
    where target_id in (${Array(PAGE).fill('?').join(', ')}) and quantity in (${STORED.map(() => '?').join(', ')}) and status in (${SHOWN.map(() => '?').join(', ')})`,
);

const app = express();
app.get('/api/projects/:projectId/targets', (req, res) => {
  const token = (req.headers.authorization ?? '').replace(/^Bearer /, '');
  const user = owner.get(createHash('sha256').update(token).digest('hex'));
  if (!user) return res.status(401).json({ error: { code: 'unauthenticated' } });
  const projectId = Number(req.params.projectId);
  if (!member.get(projectId, user.id)) return res.status(404).json({ error: { code: 'not_found' } });
  const pageNumber = Number(req.query.page ?? 1);
  const rows = page.all(projectId, (pageNumber - 1) * PAGE);
  const ids = rows.map((r) => r.id);
  const newest = new Map();
  for (const v of valuesOf.all(...ids, ...Array(PAGE - ids.length).fill(null), ...STORED, ...SHOWN)) {
    const key = `${v.target_id}:${v.quantity}`;
    if ((newest.get(key)?.revision ?? 0) < v.revision) newest.set(key, v);
  }
  const items = rows.map((r) => {
    const values = {};
    for (const [column, sources] of Object.entries(SOURCES)) {
      const v = sources.map((q) => newest.get(`${r.id}:${q}`)).find(Boolean);
      if (v) {
        const interval = v.interval_low == null ? null : { low: v.interval_low, high: v.interval_high };
        values[column] = { quantity: v.quantity, value: v.value, uncertainty: v.uncertainty, interval, unit: v.unit, label: v.label, status: v.status };
      }
    }
    return {
      id: r.id,
      projectId: r.project_id,
      designation: r.designation,
      raDeg: r.ra_deg,
      decDeg: r.dec_deg,
      notes: r.notes,
      tags: JSON.parse(r.tags),
      assumedClass: r.assumed_class,
      createdAt: r.created_at,
      updatedAt: r.updated_at,
      values,
      awaitingReview: r.awaiting_review,
    };
  });
  res.set('Cache-Control', 'no-store').json({ items, total: count.get(projectId).n, page: pageNumber, pageSize: PAGE });
});
app.listen(Number(port), '127.0.0.1', () => console.log('floor running'));
