import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

// src/domain must stay pure TypeScript: no React, no Node APIs, no clock, nothing from outside src/domain.
const root = resolve(dirname(fileURLToPath(import.meta.url)), '../../src/domain');
const owned = ['hazards', 'calc', 'propellants', 'procedures', 'count'];

function files(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) =>
    e.isDirectory() ? files(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : [],
  );
}

const sources = owned.flatMap((d) => files(join(root, d)));

describe('domain purity', () => {
  it('finds the modules', () => expect(sources.length).toBeGreaterThanOrEqual(10));

  it.each(sources.map((f) => [relative(root, f), f]))('%s imports only relative paths inside src/domain', (_name, file) => {
    const text = readFileSync(file, 'utf8');
    const specs = [...text.matchAll(/from\s+'([^']+)'/g)].map((m) => m[1]);
    for (const spec of specs) {
      expect(spec.startsWith('.')).toBe(true);
      expect(spec).not.toMatch(/\.(ts|js)$/);
      expect(resolve(dirname(file), spec).startsWith(root)).toBe(true);
    }
    expect(text).not.toMatch(/Date\.now|new Date\(|Math\.random|process\.|require\(/);
  });
});
