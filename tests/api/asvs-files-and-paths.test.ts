import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { makeWorld, signIn, type World } from '../support/world';

let world: World;
afterEach(async () => world?.db.destroy());

const INDEX_HTML = '<!doctype html><html><head></head><body><div id="root"></div></body></html>';

/**
 * A checkout as the server runs from it: the built client in dist/ beside the
 * repository's own files, each holding a marker that must never be sent.
 */
function checkout(): { clientDir: string; markers: string[] } {
  const root = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-checkout-'));
  const markers: string[] = [];
  const put = (relative: string) => {
    const marker = `MARKER-${markers.length}-${relative}`;
    markers.push(marker);
    fs.mkdirSync(path.dirname(path.join(root, relative)), { recursive: true });
    fs.writeFileSync(path.join(root, relative), marker);
  };
  for (const f of ['.git/config', '.git/HEAD', 'package.json', 'server/config.ts', '.env', 'data/starledger.sqlite', 'data/backups/starledger-2026-12-02T031500Z.sqlite', 'dist/.git/config', 'dist/.env']) put(f);
  fs.mkdirSync(path.join(root, 'dist', 'assets'), { recursive: true });
  fs.writeFileSync(path.join(root, 'dist', 'index.html'), INDEX_HTML);
  fs.writeFileSync(path.join(root, 'dist', 'assets', 'index-3f9a1c2b.js'), 'console.log("client");\n');
  return { clientDir: path.join(root, 'dist'), markers };
}

/** A GET sent with its path exactly as written (supertest and fetch would tidy `..` away before sending). */
async function rawGet(app: World['app'], rawPath: string): Promise<{ status: number; body: string; contentType: string | undefined }> {
  const server = app.listen(0);
  try {
    const { port } = server.address() as AddressInfo;
    return await new Promise((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port, path: rawPath }, (res) => {
          const parts: Buffer[] = [];
          res.on('data', (c: Buffer) => parts.push(c));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body: Buffer.concat(parts).toString(), contentType: res.headers['content-type'] }));
        })
        .on('error', reject);
    });
  } finally {
    server.close();
  }
}

// Each check names the OWASP ASVS 4.0.3 requirement it stands for (docs/security.md).
describe('what the web tier serves', () => {
  it('serves no metadata, source, database or backup file and no directory listing, by any path or encoding: only the client page or a 404 (ASVS 4.3.2, 12.5.1)', async () => {
    const { clientDir, markers } = checkout();
    world = await makeWorld({ clientDir });
    const attempts = [
      '/.git/config',
      '/.git/HEAD',
      '/.env',
      '/package.json',
      '/server/config.ts',
      '/starledger.sqlite',
      '/data/starledger.sqlite',
      '/data/backups/starledger-2026-12-02T031500Z.sqlite',
      '/../package.json',
      '/../.git/config',
      '/../server/config.ts',
      '/../data/starledger.sqlite',
      '/assets/../../package.json',
      '/%2e%2e/package.json',
      '/%2e%2e/%2e%2e/package.json',
      '/assets/%2e%2e/%2e%2e/.git/config',
      '/..%2fpackage.json',
      '/%2e%2e%2fserver%2fconfig.ts',
      '/..%5cpackage.json',
      '/dist/',
      '/dist/index.html',
      '/assets/',
      '/assets',
      '/',
    ];
    for (const attempt of attempts) {
      const res = await rawGet(world.app, attempt);
      for (const marker of markers) expect(res.body, attempt).not.toContain(marker);
      // A directory listing would name the files in it.
      expect(res.body, attempt).not.toContain('index-3f9a1c2b.js');
      if (res.status === 200) expect(res.body, attempt).toBe(INDEX_HTML);
      // serve-static answers a folder's name without its slash with a redirect to the slash, whose answer is checked in its turn.
      else expect([301, 400, 403, 404], attempt).toContain(res.status);
    }
    // The control: the client's own files are served, so the refusals above are not a server that serves nothing.
    expect((await rawGet(world.app, '/assets/index-3f9a1c2b.js')).body).toBe('console.log("client");\n');
  });
});

describe('an uploaded file’s name', () => {
  // Sent name → stored name: busboy (under multer) keeps only what follows the last / or \ (its preservePath is off), as RFC 7578 §4.2 asks of a receiver.
  const hostileNames: Record<string, string> = {
    '../../../tmp/h8-pwned.csv': 'h8-pwned.csv',
    'C:\\..\\x.csv': 'x.csv',
    '..\\..\\h8-pwned-win.csv': 'h8-pwned-win.csv',
    '/etc/h8-pwned.csv': 'h8-pwned.csv',
  };

  it('is data only: the file is kept in the database, no file is made from its name anywhere, and the name is shown as stored (ASVS 12.3.1, 12.3.2, 12.4.1)', async () => {
    world = await makeWorld();
    const s = await signIn(world.app, 'observer');
    const content = 'target,quantity,value,unit\nT 1,parallax,12.5,mas\n';
    const places = [os.tmpdir(), '/tmp', process.cwd(), path.resolve(process.cwd(), '..'), '/'];
    const before = new Map(places.map((p) => [p, new Set(fs.readdirSync(p))]));
    for (const [name, storedAs] of Object.entries(hostileNames)) {
      const res = await s.agent.post(`/api/projects/${world.projectId}/uploads`).set('X-CSRF-Token', s.csrf).attach('file', Buffer.from(content), name);
      expect(res.status, name).toBe(201);
      const stored = res.body.upload.filename as string;
      expect(stored, name).toBe(storedAs);
      // What is stored is shown the same in the list and the download.
      const list = await s.agent.get(`/api/projects/${world.projectId}/uploads`).expect(200);
      expect(list.body.uploads.map((u: { filename: string }) => u.filename), name).toContain(stored);
      const file = await s.agent
        .get(`/api/projects/${world.projectId}/uploads/${res.body.upload.id}/file`)
        .buffer(true)
        .parse((r, done) => {
          const parts: Buffer[] = [];
          r.on('data', (c: Buffer) => parts.push(c));
          r.on('end', () => done(null, Buffer.concat(parts)));
        })
        .expect(200);
      expect((file.body as Buffer).toString(), name).toBe(content);
      expect(file.headers['content-disposition'], name).toBe(`attachment; filename*=UTF-8''${encodeURIComponent(stored)}`);
      // The bytes are in the uploads table, not beside the served client.
      const row = await world.db('uploads').where({ id: res.body.upload.id }).first();
      expect(Buffer.from(row.content).toString(), name).toBe(content);
      // Nothing was made where the name points, resolved from here or from the temporary folder.
      for (const base of [process.cwd(), os.tmpdir()]) expect(fs.existsSync(path.resolve(base, name)), `${name} from ${base}`).toBe(false);
      expect(fs.existsSync(path.resolve('/', stored)), name).toBe(false);
    }
    for (const p of places) {
      const added = fs.readdirSync(p).filter((f) => !before.get(p)!.has(f));
      expect(added.filter((f) => /pwned|x\.csv/.test(f)), p).toEqual([]);
    }
  });
});
