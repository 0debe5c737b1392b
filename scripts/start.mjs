// `npm start`: build what is missing or stale, then run the server, which
// migrates the database, seeds the demo into an empty one (SEED_DEMO=true,
// set below unless given) and starts the local mail fake (see server/index.ts).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');

function newestMtime(entries) {
  let newest = 0;
  for (const entry of entries) {
    const full = path.join(root, entry);
    if (!fs.existsSync(full)) continue;
    const stat = fs.statSync(full);
    if (stat.isDirectory()) {
      for (const child of fs.readdirSync(full)) newest = Math.max(newest, newestMtime([path.join(entry, child)]));
    } else newest = Math.max(newest, stat.mtimeMs);
  }
  return newest;
}

function stale(output, inputs) {
  const out = path.join(root, output);
  return !fs.existsSync(out) || fs.statSync(out).mtimeMs < newestMtime(inputs);
}

const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
if (stale('dist/index.html', ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts'])) {
  console.log('Building the client…');
  execFileSync(npm, ['run', 'build:client'], { cwd: root, stdio: 'inherit' });
}
if (stale('build/server.js', ['server', 'shared', 'migrations', 'seeds'])) {
  execFileSync(npm, ['run', 'build:server', '--silent'], { cwd: root, stdio: 'inherit' });
}
process.env.NODE_ENV ??= 'production';
// The demo: the server itself seeds nothing unless asked (server/config.ts); `npm start` asks, unless SEED_DEMO=false.
process.env.SEED_DEMO ??= 'true';
// The demo's site admin has no second factor, so the demo lets site-admin pages go without one; a real site leaves this unset (required; README).
if (process.env.SEED_DEMO === 'true') process.env.ADMIN_SECOND_FACTOR ??= 'optional';
await import(path.join(root, 'build/server.js'));
