import { describe, expect, it } from 'vitest';
import { hashCostFor, PRODUCTION_COST } from '../../../server/lib/passwords';

describe('the scrypt cost new password hashes are made with', () => {
  it('is N = 2^15, r = 8, p = 1 in a server: r and p as OWASP\'s Password Storage Cheat Sheet gives them, N a quarter of its 2^17 (common practice, from memory; docs/security.md, ASVS 2.4.1)', () => {
    expect(PRODUCTION_COST).toEqual({ N: 32768, r: 8, p: 1 });
    expect(hashCostFor({})).toEqual(PRODUCTION_COST);
    expect(hashCostFor({ NODE_ENV: 'production' })).toEqual(PRODUCTION_COST);
  });

  it('is lowered only in the test runner, only to a power of two, and never raised by it', () => {
    expect(hashCostFor({ NODE_ENV: 'test', STARLEDGER_TEST_SCRYPT_N: '1024' })).toEqual({ N: 1024, r: 8, p: 1 });
    // A server told the test runner's setting keeps the production cost.
    expect(hashCostFor({ NODE_ENV: 'production', STARLEDGER_TEST_SCRYPT_N: '1024' })).toEqual(PRODUCTION_COST);
    expect(hashCostFor({ STARLEDGER_TEST_SCRYPT_N: '1024' })).toEqual(PRODUCTION_COST);
    for (const bad of ['1000', '1', '0', '-1024', 'low', '', String(2 ** 16)]) {
      expect(hashCostFor({ NODE_ENV: 'test', STARLEDGER_TEST_SCRYPT_N: bad })).toEqual(PRODUCTION_COST);
    }
  });
});
