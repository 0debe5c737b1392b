import { afterEach, describe, expect, it } from 'vitest';
import { derivedValueTexts } from '../../src/lib/derived-words';
import { commitFile, newestDerived } from '../support/night';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const PC_M = 3.0856775814913673e16; // IAU 2015 Resolution B2: 1 pc = 648 000/π au, au = 149 597 870 700 m (IAU 2012 B2)

describe('the asymmetric 68 % interval of a derived value', () => {
  it('is stored where its arms differ, sent with the value and the table row, and printed +a/−b', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    // σp/p = 0.3: d = 1/p is strongly non-linear. A quantile of a monotone function is the function of the quantile
    // (exactly, for p > 0, and p ≤ 0 has probability 4 × 10⁻⁴ here), so the distance's 15.87th and 84.13th
    // percentiles are 1/(10 + 3) mas = 76.9 pc and 1/(10 − 3) mas = 142.9 pc; the value is 1/p = 100 pc.
    await commitFile(observer, world, ['target,quantity,value,uncertainty,unit', 'T 1,parallax,10,3,mas'].join('\n'));
    const derived = await newestDerived(observer, world);
    const d = derived.distance_parallax;
    expect(d.value / PC_M).toBeCloseTo(100, 6);
    expect(d.interval).not.toBeNull();
    // 1000 draws: each percentile scatters by about 3 % of the arm here, so 6 % is two of those (the draws are the target's own, reproducible).
    expect(d.interval!.low / PC_M).toBeGreaterThan(76.9 * 0.94);
    expect(d.interval!.low / PC_M).toBeLessThan(76.9 * 1.06);
    expect(d.interval!.high / PC_M).toBeGreaterThan(142.9 * 0.94);
    expect(d.interval!.high / PC_M).toBeLessThan(142.9 * 1.06);
    const stored = await world.db('derived_values').where({ target_id: world.targetId, quantity: 'distance_parallax' }).first();
    expect(stored.interval_low).toBe(d.interval!.low);
    expect(stored.interval_high).toBe(d.interval!.high);

    // Printed on the sheet and the queue as +a/−b, not ±σ.
    const [text] = derivedValueTexts(d);
    expect(text).toMatch(/^100 \+\d+\/−\d+ pc$/);
    expect(text).not.toContain('±');

    // The target table carries the same interval.
    const rows = await observer.agent.get(`/api/projects/${world.projectId}/targets`).expect(200);
    const row = rows.body.items.find((t: { id: number }) => t.id === world.targetId);
    expect(row.values.distance.interval).toEqual(d.interval);
  });

  it('is null where the draws are symmetric (a precise parallax), and ±σ is printed', async () => {
    world = await makeWorld();
    const observer = await signIn(world.app, 'observer');
    await commitFile(observer, world, ['target,quantity,value,uncertainty,unit', 'T 1,parallax,10,0.05,mas'].join('\n'));
    const d = (await newestDerived(observer, world)).distance_parallax;
    expect(d.interval).toBeNull();
    expect(derivedValueTexts(d)[0]).toContain('±');
  });
});
