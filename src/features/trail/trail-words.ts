/*
 * What the trail page calls each recorded action and each kind of subject.
 * The server writes stable action ids (`<entity>.<verb>`); people read these
 * words. The export keeps the ids, which a script can rely on.
 */

/** Actions recorded inside a project, in the order the action filter offers them. */
export const PROJECT_ACTION_WORDS = {
  'upload.received': 'File received',
  'upload.committed': 'Upload committed',
  'upload.discarded': 'Upload discarded',
  'target.created': 'Target added',
  'target.updated': 'Target edited',
  'target.deleted': 'Target deleted',
  'value.proposed': 'Value proposed',
  'value.approved': 'Value approved',
  'value.rejected': 'Value rejected',
  'value.superseded': 'Value superseded',
  'derivations.rerun': 'Derivations re-run',
  'member.added': 'Member added',
  'member.role_changed': 'Role changed',
  'member.removed': 'Member removed',
  'invitation.created': 'Invitation sent',
  'invitation.revoked': 'Invitation withdrawn',
  'project.created': 'Project created',
  'project.updated': 'Settings changed',
} as const satisfies Record<string, string>;

/** Actions that belong to a person rather than a project (kept in the trail, not shown on a project's page). */
const PERSONAL_ACTION_WORDS: Record<string, string> = {
  'token.created': 'API token created',
  'token.revoked': 'API token revoked',
  'user.created': 'Account created',
  'user.password_reset': 'Password set from a reset link',
  'user.password_changed': 'Password changed by its owner',
};

export type ProjectAction = keyof typeof PROJECT_ACTION_WORDS;

export const PROJECT_ACTIONS = Object.keys(PROJECT_ACTION_WORDS) as ProjectAction[];

/** The words for an action; an action this client does not know yet is shown by its id rather than hidden. */
export function actionWords(action: string): string {
  return (PROJECT_ACTION_WORDS as Record<string, string>)[action] ?? PERSONAL_ACTION_WORDS[action] ?? action;
}

const ENTITY_WORDS: Record<string, string> = {
  target: 'Target',
  upload: 'Upload',
  derived_value: 'Value',
  member: 'Member',
  invitation: 'Invitation',
  project: 'Project',
  token: 'API token',
  user: 'Account',
};

export function entityWords(entityType: string): string {
  return ENTITY_WORDS[entityType] ?? entityType;
}

/** Field names in a before/after record, as the summary line shows them (R<sub>V</sub> is typeset by the component). */
const FIELD_WORDS: Record<string, string> = {
  designation: 'designation',
  ra: 'RA',
  dec: 'Dec',
  raDeg: 'RA',
  decDeg: 'Dec',
  notes: 'notes',
  tags: 'tags',
  assumedClass: 'assumed luminosity class',
  role: 'role',
  email: 'e-mail',
  name: 'name',
  description: 'description',
  site: 'site',
  status: 'status',
  filename: 'file',
  measurementsAdded: 'measurements added',
  targetsCreated: 'targets created',
  derivedProposed: 'values proposed',
  targets: 'targets',
  proposed: 'values proposed',
  uploadId: 'upload',
  row: 'row',
  kind: 'kind',
};

export function fieldWords(field: string): string {
  return FIELD_WORDS[field] ?? field;
}
