import { OpenAPIRegistry, OpenApiGeneratorV31 } from '@asteasolutions/zod-to-openapi';
import { z } from 'zod';
import { errorCodes } from '../shared/errors';
import { permissions, roleLabels } from '../shared/schemas/roles';
import type { Access } from './middleware/access';
import { bodyMediaType, type RouteDef } from './routes';

/**
 * The OpenAPI 3.1 document of the whole API, generated from the route table
 * (server/routes.ts) and the zod schemas its routes validate with, by
 * @asteasolutions/zod-to-openapi: a route cannot be added without appearing
 * here with its parameters and body, as the validation sees them.
 */

/** Every error the API answers has this shape (server/middleware/error-handler.ts). */
const apiError = z
  .object({
    error: z.object({
      code: z.string().meta({ description: `One of: ${Object.keys(errorCodes).join(', ')}.`, examples: ['validation_failed'] }),
      message: z.string().meta({ description: 'For people; it may change. Programs read the code.' }),
      details: z
        .array(z.object({ path: z.string(), message: z.string() }))
        .optional()
        .meta({ description: 'With validation_failed: one entry per field, `path` naming the field (dotted when nested).' }),
      reference: z
        .string()
        .optional()
        .meta({ description: 'With internal: a random id that also stands on the server’s log line for this error; quote it to the operator.' }),
    }),
  })
  .meta({ id: 'Error' });

/** Who may call a route, in words. */
function accessWords(access: Access): string {
  if (access.kind === 'public') return 'Anyone, signed in or not.';
  if (access.kind === 'user') return 'Anyone signed in (a session cookie, or a personal API token sent as “Authorization: Bearer …”).';
  if (access.kind === 'siteAdmin') return 'Site admins only.';
  const roles = permissions[access.permission].map((r) => roleLabels[r]).join(', ');
  return `Members of the project whose role allows “${access.permission}”: ${roles}.`;
}

/** Express's `:name` path parameters as OpenAPI's `{name}`. */
export function openApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z_]\w*)/g, '{$1}');
}

/** Names of the API's parts, by the path's first word after the project (or its first segment). */
const TAG_WORDS: Readonly<Record<string, string>> = {
  'openapi.json': 'This description',
  auth: 'Sign-in and passwords',
  invitations: 'Invitations',
  tokens: 'API tokens',
  'mail-preferences': 'Mail preferences',
  account: 'Your data',
  admin: 'Site administration',
  users: 'Accounts',
  projects: 'Projects',
  members: 'Members',
  targets: 'Targets and their values',
  'review-queue': 'Review',
  review: 'Review',
  values: 'Values export',
  rederive: 'Review',
  hr: 'HR diagram',
  uploads: 'Uploads',
  summary: 'Weekly summary',
  trail: 'Trail',
  activity: 'Trail',
};

/** The part of the API a path belongs to. */
function tagOf(path: string): string {
  const parts = path.split('/').filter((p) => p && !p.startsWith(':'));
  const word = (parts[0] === 'projects' && parts.length > 1 ? parts[1] : parts[0]) ?? '';
  return TAG_WORDS[word] ?? (word ? word.charAt(0).toUpperCase() + word.slice(1).replace(/-/g, ' ') : 'Other');
}

const errorResponse = (description: string) => ({ description, content: { 'application/json': { schema: apiError } } });

/** Errors a route may answer, from what its table entry says it checks. */
function errorResponses(route: RouteDef) {
  const out: Record<string, ReturnType<typeof errorResponse>> = {};
  if (route.params || route.query || route.body) out['400'] = errorResponse('validation_failed (with `details` per field) or malformed_json.');
  if (route.access.kind !== 'public') out['401'] = errorResponse('unauthenticated: no session and no valid token.');
  const refusals = [
    route.method !== 'get' && 'csrf_invalid (a session without the X-CSRF-Token header)',
    (route.method !== 'get' || route.access.kind === 'siteAdmin' || route.access.kind === 'project') && 'forbidden: the caller’s role does not allow it',
    route.access.kind !== 'public' && !(route.access.kind === 'user' && route.access.beforePasswordChange) && 'password_change_required: the account must choose a new password first (POST /auth/password)',
  ].filter((r): r is string => typeof r === 'string');
  if (refusals.length > 0) out['403'] = errorResponse(`${refusals.join('; or ')}.`);
  const mediaType = bodyMediaType(route);
  if (mediaType) out['415'] = errorResponse(`unsupported_media_type: a body sent as anything but ${mediaType}.`);
  if (route.params) out['404'] = errorResponse('not_found: no such project, target or record for this caller.');
  out['503'] = errorResponse('database_busy: try again after the Retry-After header’s seconds.');
  out['507'] = errorResponse('storage_full: nothing was saved.');
  out['500'] = errorResponse('internal: the error was logged under the answer’s `reference`.');
  return out;
}

export function openApiDocument(routes: readonly RouteDef[], version: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'bearerToken', {
    type: 'http',
    scheme: 'bearer',
    description: 'A personal API token (Account → API tokens). Writes with a token need no CSRF header.',
  });
  registry.registerComponent('securitySchemes', 'session', { type: 'apiKey', in: 'cookie', name: 'starledger.sid', description: 'The browser’s session (named `__Host-starledger.sid` where the server sets Secure cookies, COOKIE_SECURE=true); writes also send X-CSRF-Token.' });
  for (const route of routes) {
    // A file upload sends its fields as multipart form data beside the file.
    const mediaType = bodyMediaType(route);
    const body = route.body
      ? mediaType === 'multipart/form-data'
        ? { content: { 'multipart/form-data': { schema: (route.body as z.ZodObject).extend({ file: z.string().meta({ format: 'binary', description: 'The file (CSV).' }) }) } } }
        : { content: { 'application/json': { schema: route.body } } }
      : undefined;
    registry.registerPath({
      method: route.method,
      path: openApiPath(route.path),
      operationId: `${route.method}${openApiPath(route.path).replace(/[{}]/g, '').replace(/[^A-Za-z0-9]+(.)?/g, (_, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
      tags: [tagOf(route.path)],
      description: `Who may call it: ${accessWords(route.access)}`,
      security: route.access.kind === 'public' ? [] : [{ bearerToken: [] }, { session: [] }],
      request: {
        ...(route.params ? { params: route.params as z.ZodObject } : {}),
        ...(route.query ? { query: route.query as z.ZodObject } : {}),
        ...(body ? { body } : {}),
      },
      responses: { '200': { description: 'Success (201 where something was created; 204 where nothing is sent back).' }, ...errorResponses(route) },
    });
  }
  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Starledger API',
      version,
      description:
        'The API the Starledger pages use, open to observing pipelines. Every path is under /api. Error bodies share one shape (components.schemas.Error): programs read `error.code`.',
    },
    servers: [{ url: '/api' }],
  });
}
