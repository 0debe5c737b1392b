import type { Knex } from 'knex';
import * as init from './20261201000000_init';
import * as measurements from './20261201010000_measurements';
import * as uploadSummary from './20261201020000_upload_summary';
import * as review from './20261202000000_review';
import * as trailAppendOnly from './20261202010000_trail_append_only';
import * as mailOutbox from './20261202020000_mail_outbox';
import * as derivedInterval from './20261202040000_derived_interval';
import * as mailSummaryPreferences from './20261202030000_mail_summary_preferences';
import * as uploadStorage from './20261202060000_upload_storage';
import * as invitationsPasswordResets from './20261202070000_invitations_password_resets';
import * as targetListIndexes from './20261202080000_target_list_indexes';
import * as projectTargetCount from './20261202090000_project_target_count';
import * as projectTargetCountFill from './20261202090100_project_target_count_fill';
import * as loginThrottle from './20261202093000_login_throttle';
import * as unboundedTexts from './20261202100000_unbounded_texts';
import * as uploadErrorChunks from './20261202190000_upload_error_chunks';
import * as uploadErrorChunksFill from './20261202190100_upload_error_chunks_fill';
import * as dropUploadErrors from './20261202190200_drop_upload_errors';
import * as sessionDetailsTokenExpiry from './20261203004100_session_details_token_expiry';
import * as tokenExpiryFill from './20261203004200_token_expiry_fill';
import * as mustChangePassword from './20261203013700_must_change_password';
import * as projectTargetCountPerStatement from './20261203221000_project_target_count_per_statement';
import * as uploadCommitProgress from './20261203222000_upload_commit_progress';
import * as secondFactor from './20261203224700_second_factor';
import * as recoveryCodeSalt from './20261204063000_recovery_code_salt';
import * as spectrumPreviewPoints from './20261205080000_spectrum_preview_points';

/**
 * Migrations are imported statically so that the app bundle, the tests and
 * the knex CLI all run the same list (knex's own loader cannot import .ts
 * inside vitest). A new migration is added to this list, in order; names are
 * recorded without an extension.
 */
const migrations: Record<string, Knex.Migration> = {
  '20261201000000_init': init,
  '20261201010000_measurements': measurements,
  '20261201020000_upload_summary': uploadSummary,
  '20261202000000_review': review,
  '20261202010000_trail_append_only': trailAppendOnly,
  '20261202020000_mail_outbox': mailOutbox,
  '20261202040000_derived_interval': derivedInterval,
  '20261202030000_mail_summary_preferences': mailSummaryPreferences,
  '20261202060000_upload_storage': uploadStorage,
  '20261202070000_invitations_password_resets': invitationsPasswordResets,
  '20261202080000_target_list_indexes': targetListIndexes,
  '20261202090000_project_target_count': projectTargetCount,
  '20261202090100_project_target_count_fill': projectTargetCountFill,
  '20261202093000_login_throttle': loginThrottle,
  '20261202100000_unbounded_texts': unboundedTexts,
  '20261202190000_upload_error_chunks': uploadErrorChunks,
  '20261202190100_upload_error_chunks_fill': uploadErrorChunksFill,
  '20261202190200_drop_upload_errors': dropUploadErrors,
  '20261203004100_session_details_token_expiry': sessionDetailsTokenExpiry,
  '20261203004200_token_expiry_fill': tokenExpiryFill,
  '20261203013700_must_change_password': mustChangePassword,
  '20261203221000_project_target_count_per_statement': projectTargetCountPerStatement,
  '20261203222000_upload_commit_progress': uploadCommitProgress,
  '20261203224700_second_factor': secondFactor,
  '20261204063000_recovery_code_salt': recoveryCodeSalt,
  '20261205080000_spectrum_preview_points': spectrumPreviewPoints,
};

export const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => Object.keys(migrations).sort(),
  getMigrationName: (name) => name,
  getMigration: async (name) => migrations[name],
};
