import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

/** A built client of the shape Vite writes: index.html and content-hashed assets. */
function builtClient(): { dir: string; script: string } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-client-'));
  fs.mkdirSync(path.join(dir, 'assets'));
  const script = 'const ledger = ' + JSON.stringify(Array.from({ length: 400 }, (_, i) => ({ star: `GW ${i}`, temperature: 5000 + i }))) + ';\n';
  fs.writeFileSync(path.join(dir, 'assets', 'index-3f9a1c2b.js'), script);
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><html><head><script type="module" src="/assets/index-3f9a1c2b.js"></script></head><body><div id="root"></div></body></html>');
  return { dir, script };
}

/** The bytes exactly as sent (supertest would decode them), with the headers. */
async function fetchRaw(app: World['app'], url: string, acceptEncoding: string): Promise<{ headers: http.IncomingHttpHeaders; body: Buffer }> {
  const server = app.listen(0);
  try {
    const { port } = server.address() as AddressInfo;
    return await new Promise((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path: url, headers: { 'Accept-Encoding': acceptEncoding } }, (res) => {
          const parts: Buffer[] = [];
          res.on('data', (c: Buffer) => parts.push(c));
          res.on('end', () => resolve({ headers: res.headers, body: Buffer.concat(parts) }));
        })
        .on('error', reject);
    });
  } finally {
    server.close();
  }
}

describe('what the server sends over the wire', () => {
  it('compresses text assets with brotli or gzip, by what the client accepts (RFC 9110 §12.5.3), and the bytes decode to the file', async () => {
    const client = builtClient();
    world = await makeWorld({ clientDir: client.dir });
    const br = await fetchRaw(world.app, '/assets/index-3f9a1c2b.js', 'br, gzip');
    expect(br.headers['content-encoding']).toBe('br');
    expect(zlib.brotliDecompressSync(br.body).toString()).toBe(client.script);
    expect(br.body.length).toBeLessThan(client.script.length / 3);
    const gz = await fetchRaw(world.app, '/assets/index-3f9a1c2b.js', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(gz.body).toString()).toBe(client.script);
    const plain = await fetchRaw(world.app, '/assets/index-3f9a1c2b.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(client.script);
  });

  it('caches hashed assets for a year as immutable, and the page itself not at all (RFC 9111; RFC 8246)', async () => {
    world = await makeWorld({ clientDir: builtClient().dir });
    const asset = await request(world.app).get('/assets/index-3f9a1c2b.js').expect(200);
    expect(asset.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    const page = await request(world.app).get('/projects/1').expect(200);
    expect(page.headers['cache-control']).toBe('no-cache');
    // A missing asset is a 404, not the page in its place (which a browser would cache under the asset's name).
    await request(world.app).get('/assets/index-00000000.js').expect(404);
  });

  it('compresses JSON answers of the API', async () => {
    world = await makeWorld();
    const lead = await signIn(world.app, 'lead');
    for (let i = 2; i <= 40; i++) await world.db('targets').insert({ project_id: world.projectId, designation: `T ${i}`, designation_key: `t${i}`, ra_deg: i, dec_deg: 0, notes: '', tags: '[]', created_at: '2026-11-30T22:00:00.000Z', updated_at: '2026-11-30T22:00:00.000Z' });
    const res = await lead.agent.get(`/api/projects/${world.projectId}/targets?pageSize=50`).set('Accept-Encoding', 'gzip').expect(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.body.items).toHaveLength(40);
  });
});
