import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(import.meta.dirname, '../../..');
const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')) as { name: string; version: string; dependencies: Record<string, string>; devDependencies: Record<string, string> };
const lock = JSON.parse(fs.readFileSync(path.join(root, 'package-lock.json'), 'utf8')) as { packages: Record<string, { version: string; dev?: boolean }> };

interface Component {
  'bom-ref': string;
  name: string;
  version: string;
  purl: string;
  properties?: Array<{ name: string; value: string }>;
}
interface Bom {
  bomFormat: string;
  specVersion: string;
  metadata: { component: { 'bom-ref': string; name: string; version: string } };
  components: Component[];
  dependencies: Array<{ ref: string; dependsOn?: string[] }>;
}

/** Each package-lock.json entry as <name>@<version> (its name is what follows the path's last node_modules/), split by whether it is only for development. */
function lockPackages(dev: boolean): Set<string> {
  return new Set(
    Object.entries(lock.packages)
      .filter(([where, entry]) => where !== '' && Boolean(entry.dev) === dev)
      .map(([where, entry]) => `${where.slice(where.lastIndexOf('node_modules/') + 'node_modules/'.length)}@${entry.version}`),
  );
}

let dir: string;
let bom: Bom;
beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'starledger-sbom-'));
  const file = path.join(dir, 'bom.cdx.json');
  execFileSync(process.execPath, [path.join(root, 'scripts', 'sbom.mjs'), file], { cwd: root, stdio: 'pipe' });
  bom = JSON.parse(fs.readFileSync(file, 'utf8'));
}, 60_000);
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('npm run sbom (ASVS 4.0.3 14.2.5)', () => {
  it('writes a CycloneDX document naming Starledger at its package.json version', () => {
    // CycloneDX 1.5 JSON schema: bomFormat is the constant "CycloneDX", specVersion the schema's version.
    expect(bom.bomFormat).toBe('CycloneDX');
    expect(bom.specVersion).toMatch(/^1\.\d+$/);
    expect(bom.metadata.component).toMatchObject({ name: pkg.name, version: pkg.version });
  });

  it('lists express at the version package-lock.json installs, with its package URL', () => {
    const express = bom.components.filter((c) => c.name === 'express');
    const version = lock.packages['node_modules/express']!.version;
    expect(express).toHaveLength(1);
    expect(express[0]!.version).toBe(version);
    // Package URL spec (github.com/package-url/purl-spec, type "npm"): pkg:npm/<name>@<version>.
    expect(express[0]!.purl).toBe(`pkg:npm/express@${version}`);
  });

  it('lists every package package-lock.json installs for running, zod among them (npm/cli#7909 drops it under --omit dev), and no development tool', () => {
    const listed = new Set(bom.components.map((c) => c['bom-ref']));
    expect(listed).toContain(`zod@${lock.packages['node_modules/zod']!.version}`);
    expect([...lockPackages(false)].filter((p) => !listed.has(p))).toEqual([]);
    const development = lockPackages(true);
    expect(bom.components.filter((c) => development.has(c['bom-ref']) && !lockPackages(false).has(c['bom-ref'])).map((c) => c['bom-ref'])).toEqual([]);
    for (const tool of ['vitest', 'typescript', 'playwright-core']) {
      expect(tool in pkg.devDependencies, `${tool} is a devDependency`).toBe(true);
      expect(bom.components.some((c) => c.name === tool), tool).toBe(false);
    }
    expect(bom.components.filter((c) => c.properties?.some((p) => p.name === 'cdx:npm:package:development'))).toEqual([]);
  });

  it('has a dependency graph whose every edge names a listed component (CycloneDX 1.5: dependsOn holds bom-refs)', () => {
    const refs = new Set([bom.metadata.component['bom-ref'], ...bom.components.map((c) => c['bom-ref'])]);
    const dangling = bom.dependencies.flatMap((d) => [d.ref, ...(d.dependsOn ?? [])]).filter((ref) => !refs.has(ref));
    expect(dangling).toEqual([]);
    const top = bom.dependencies.find((d) => d.ref === bom.metadata.component['bom-ref']);
    expect(new Set(top?.dependsOn)).toEqual(new Set(Object.keys(pkg.dependencies).map((name) => `${name}@${lock.packages[`node_modules/${name}`]!.version}`)));
  });
});
