import { compileErrors, validate } from '@readme/openapi-parser';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { createDb } from '../../server/db/knex';
import { systemClock } from '../../server/lib/clock';
import { createPassport } from '../../server/middleware/auth';
import { createLoginThrottle } from '../../server/modules/auth/login-throttle';
import { openApiPath } from '../../server/openapi';
import { apiRoutes, type RouteDef } from '../../server/routes';
import { createServices } from '../../server/services';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

function declaredRoutes(): RouteDef[] {
  const db = createDb('file::memory:');
  const services = createServices(db, systemClock);
  const routes = apiRoutes(services, createPassport(services.users), createLoginThrottle(db, systemClock));
  void db.destroy();
  return routes;
}

interface Parameter {
  name: string;
  in: 'path' | 'query';
  required?: boolean;
}
interface Operation {
  parameters?: Parameter[];
  requestBody?: { content: Record<string, { schema: { properties?: Record<string, unknown>; $ref?: string } }> };
  responses: Record<string, { content?: { 'application/json': { schema: { $ref?: string } } } }>;
}

const keysOf = (schema: z.ZodType | undefined): string[] => Object.keys((schema as z.ZodObject | undefined)?.shape ?? {}).sort();

describe('the OpenAPI document (/api/openapi.json)', () => {
  it('is served to signed-in callers and refused to others', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'reader');
    const res = await agent.get('/api/openapi.json').expect(200);
    expect(res.body.openapi).toBe('3.1.0');
    await request(world.app).get('/api/openapi.json').expect(401);
  });

  it('validates against the OpenAPI 3.1 schema (@readme/openapi-parser)', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'observer');
    const doc = (await agent.get('/api/openapi.json').expect(200)).body;
    const result = await validate(structuredClone(doc));
    expect(result.valid, result.valid ? '' : compileErrors(result)).toBe(true);
  });

  it('lists every route of server/routes.ts with its path and query parameters, its body and the error shape', async () => {
    world = await makeWorld();
    const { agent } = await signIn(world.app, 'lead');
    const doc = (await agent.get('/api/openapi.json').expect(200)).body as { paths: Record<string, Record<string, Operation>>; components: { schemas: Record<string, unknown> } };
    expect(doc.components.schemas.Error).toBeDefined();
    const routes = declaredRoutes();
    let operations = 0;
    for (const route of routes) {
      const what = `${route.method.toUpperCase()} ${route.path}`;
      const op = doc.paths[openApiPath(route.path)]?.[route.method];
      expect(op, what).toBeDefined();
      operations += 1;
      const parameters = op.parameters ?? [];
      const inPath = [...route.path.matchAll(/:(\w+)/g)].map((m) => m[1]).sort();
      expect(parameters.filter((p) => p.in === 'path').map((p) => p.name).sort(), `${what} path parameters`).toEqual(inPath);
      expect(keysOf(route.params), `${what} params schema`).toEqual(inPath);
      expect(parameters.filter((p) => p.in === 'query').map((p) => p.name).sort(), `${what} query parameters`).toEqual(keysOf(route.query));
      if (route.body) {
        const content = op.requestBody?.content ?? {};
        const media = route.receive?.length ? 'multipart/form-data' : 'application/json';
        expect(Object.keys(content), `${what} body media type`).toEqual([media]);
        const properties = Object.keys(content[media].schema.properties ?? {}).filter((k) => k !== 'file').sort();
        // A body that is not a plain object (a refined one) is checked for presence only.
        if ((route.body as z.ZodObject).shape) expect(properties, `${what} body fields`).toEqual(keysOf(route.body));
        if (media === 'multipart/form-data') expect(content[media].schema.properties).toHaveProperty('file');
      } else {
        expect(op.requestBody, `${what} has no body`).toBeUndefined();
      }
      for (const status of ['500', '503']) expect(op.responses[status]?.content?.['application/json'].schema.$ref, `${what} ${status}`).toBe('#/components/schemas/Error');
      if (route.params || route.query || route.body) expect(op.responses['400']?.content?.['application/json'].schema.$ref, `${what} 400`).toBe('#/components/schemas/Error');
      if (route.access.kind !== 'public') expect(op.responses['401'], `${what} 401`).toBeDefined();
    }
    // No operation in the document that the table does not have.
    const documented = Object.values(doc.paths).reduce((n, methods) => n + Object.keys(methods).length, 0);
    expect(documented).toBe(operations);
  });
});
