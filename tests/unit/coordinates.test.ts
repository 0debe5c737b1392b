import { describe, expect, it } from 'vitest';
import { designationKey, formatDeclination, formatRightAscension, parseDeclination, parseRightAscension } from '../../shared/coordinates';

// 1 h of right ascension = 15°; 1′ = 1/60°, 1″ = 1/3600° (definitions of the sexagesimal units).
describe('right ascension', () => {
  it.each(['05 14 32.3', '05:14:32.3', '5h14m32.3s', '5h 14m 32.3s'])('reads %s as hours', (text) => {
    const r = parseRightAscension(text);
    expect(r.ok && r.degrees).toBeCloseTo((5 + 14 / 60 + 32.3 / 3600) * 15, 9);
  });
  it('reads a bare number as degrees', () => {
    const r = parseRightAscension('78.6346');
    expect(r.ok && r.degrees).toBe(78.6346);
  });
  it.each(['24 00 00', '-01 00 00', '12 60 00', '12 00 60', '360', '-5', 'abc', ''])('rejects %s', (text) => {
    expect(parseRightAscension(text).ok).toBe(false);
  });
  it('formats back to hours, minutes, seconds', () => {
    expect(formatRightAscension((5 + 14 / 60 + 32.3 / 3600) * 15)).toBe('05 14 32.30');
  });
});

describe('declination', () => {
  it.each(['-08 12 05', '-08:12:05', '-8d12m05s', '-08°12′05″'])('reads %s', (text) => {
    const r = parseDeclination(text);
    expect(r.ok && r.degrees).toBeCloseTo(-(8 + 12 / 60 + 5 / 3600), 9);
  });
  it('reads back what the sheets print, true minus sign included', () => {
    const deg = -(8 + 12 / 60 + 5 / 3600);
    const r = parseDeclination(formatDeclination(deg));
    expect(r.ok && r.degrees).toBeCloseTo(deg, 4);
  });
  it('keeps the sign of a negative zero-degree declination', () => {
    const r = parseDeclination('-00 30 00');
    expect(r.ok && r.degrees).toBe(-0.5);
  });
  it.each(['+95 00 00', '90.5', '-91', '10 61 00'])('rejects %s', (text) => {
    expect(parseDeclination(text).ok).toBe(false);
  });
  it('formats with a sign', () => {
    expect(formatDeclination(-(8 + 12 / 60 + 5 / 3600))).toBe('−08 12 05.0');
  });
});

describe('designation matching', () => {
  it('ignores case and spaces', () => {
    expect(designationKey('GW  101a')).toBe(designationKey('gw101A'));
  });
});
