import { describe, expect, it } from 'vitest';
import { deriveAll, type MeasurementInput } from '@shared/physics/derive';

/*
 * What the engine refuses or marks, through deriveAll: results outside the
 * published range of a law, measured zeros, and results no star can have.
 */

describe('bolometric flux from V outside the calibration of BC_V (Flower 1996, 2900–52 500 K per REFERENCES.md)', () => {
  for (const temperatureK of [1500, 200_000]) {
    it(`a ${temperatureK} K star with a V magnitude gets no flux from V but an issue naming the range`, () => {
      const measurements: MeasurementInput[] = [
        { id: 'v', kind: 'magnitude', band: 'V', valueSi: 8, uncertaintySi: 0.01 },
        { id: 't', kind: 'planck_temperature', valueSi: temperatureK, uncertaintySi: temperatureK * 0.01 },
      ];
      const graph = deriveAll(measurements, { monteCarloSamples: 200 });
      expect(graph.results.temperature?.value).toBe(temperatureK);
      expect(graph.results.bolometric_flux).toBeUndefined();
      expect(graph.issues.find((i) => i.quantity === 'bolometric_flux')).toMatchObject({ code: 'out_of_range', limit: '2900–52500 K' });
    });
  }

  it('a V magnitude so faint that the flux underflows to zero is an issue, not a value of 0 W m⁻² (IEEE 754 doubles end near 4.9e-324)', () => {
    const graph = deriveAll(
      [
        { id: 'v', kind: 'magnitude', band: 'V', valueSi: 820, uncertaintySi: 0.01 },
        { id: 't', kind: 'planck_temperature', valueSi: 5772, uncertaintySi: 50 },
      ],
      { monteCarloSamples: 200 },
    );
    expect(graph.results.bolometric_flux).toBeUndefined();
    expect(graph.issues.find((i) => i.quantity === 'bolometric_flux')).toMatchObject({ code: 'out_of_range' });
  });
});
