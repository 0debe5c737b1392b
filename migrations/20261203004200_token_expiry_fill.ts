import type { Knex } from 'knex';

/**
 * Every API token made before tokens expired now expires 365 days from this
 * migration (the longest a new token may be given), so no pipeline stops
 * without a year's notice; a token is refused once its expiry passes.
 */
export async function up(knex: Knex): Promise<void> {
  const expiresAt = new Date(Date.now() + 365 * 24 * 3600 * 1000).toISOString();
  await knex('api_tokens').whereNull('expires_at').update({ expires_at: expiresAt });
}

export async function down(): Promise<void> {
  // The column goes with the previous migration's down.
}
