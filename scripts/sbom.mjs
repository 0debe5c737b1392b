// `npm run sbom [-- <file>]`: the software bill of materials (ASVS 14.2.5)
// of what the server and the built client carry, as CycloneDX JSON, made by
// npm itself (`npm sbom`, npm ≥ 9.5) from node_modules and package-lock.json,
// without the network. Written to build/starledger-sbom.cdx.json unless a
// file is given.
//
// Development tools are left out, but not with `npm sbom --omit dev`: that
// also drops runtime packages a development tool names too (npm/cli#7909:
// here zod, a dependency of the server, because a lint plugin declares it as
// a peer, and with it qs, debug, semver and some fifty more). So the whole
// tree is listed and what package-lock.json marks `"dev": true` (what
// `npm ci --omit=dev` would not install) is removed, with its edges.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..');
const out = path.resolve(process.argv[2] ?? path.join(root, 'build', 'starledger-sbom.cdx.json'));
const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
const DEVELOPMENT = 'cdx:npm:package:development';

const bom = JSON.parse(execFileSync(npm, ['sbom', '--sbom-format', 'cyclonedx'], { cwd: root, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 }));
const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
const lock = JSON.parse(fs.readFileSync(path.join(root, 'package-lock.json'), 'utf8'));

// npm names a component's bom-ref <name>@<version>; a lock entry's name is what follows its path's last node_modules/.
const shipped = new Set(
  Object.entries(lock.packages)
    .filter(([where, entry]) => where !== '' && !entry.dev)
    .map(([where, entry]) => `${where.slice(where.lastIndexOf('node_modules/') + 'node_modules/'.length)}@${entry.version}`),
);
const rootRef = bom.metadata.component['bom-ref'];
// npm names the root component after the folder it was run in; the product's name is package.json's.
bom.metadata.component.name = pkg.name;
bom.components = bom.components
  .filter((c) => shipped.has(c['bom-ref']))
  .map((c) => ({ ...c, properties: (c.properties ?? []).filter((p) => p.name !== DEVELOPMENT) }));
const kept = new Set([rootRef, ...bom.components.map((c) => c['bom-ref'])]);
// The product's own edges are those package.json lists for running; a devDependency another package also needs stays listed, but not as the product's.
const runtime = new Set(Object.keys({ ...pkg.dependencies, ...pkg.optionalDependencies }));
const isRuntimeEdge = (ref) => runtime.has(ref.slice(0, ref.lastIndexOf('@')));
bom.dependencies = bom.dependencies
  .filter((d) => kept.has(d.ref))
  .map((d) => ({ ...d, dependsOn: (d.dependsOn ?? []).filter((ref) => kept.has(ref) && (d.ref !== rootRef || isRuntimeEdge(ref))) }));

fs.mkdirSync(path.dirname(out), { recursive: true });
fs.writeFileSync(out, `${JSON.stringify(bom, null, 2)}\n`);
console.log(`Wrote ${path.relative(process.cwd(), out) || out}: CycloneDX ${bom.specVersion}, ${bom.components.length} components.`);
