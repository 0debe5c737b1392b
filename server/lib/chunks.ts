/** Splits a list so a `WHERE … IN (…)` or a multi-row insert stays within the database's bound-parameter limit. */
export function chunks<T>(items: readonly T[], size: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}
