import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// STYLE.md "What we take" 1 and 15: feature slices import no other feature (they are composed in src/app),
// shared code (components, lib, config) imports no feature, and file names are kebab-case.
const SRC = join(process.cwd(), 'src');

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? filesUnder(path) : [path];
  });
}

const sources = filesUnder(SRC).filter((path) => /\.(ts|tsx)$/.test(path));
const importsOf = (path: string) =>
  [...readFileSync(path, 'utf8').matchAll(/from '(@\/[^']+)'|import\('(@\/[^']+)'\)/g)].map(
    (m) => m[1] ?? m[2],
  );

describe('client structure', () => {
  it('finds the sources it checks', () => {
    expect(sources.length).toBeGreaterThan(40);
  });

  it('has no imports from one feature into another', () => {
    const offences: string[] = [];
    for (const path of sources) {
      const own = /src\/features\/([^/]+)\//.exec(path)?.[1];
      if (!own) continue;
      for (const target of importsOf(path)) {
        const other = /^@\/features\/([^/]+)/.exec(target)?.[1];
        if (other && other !== own) offences.push(`${relative(SRC, path)} -> ${target}`);
      }
    }
    expect(offences).toEqual([]);
  });

  it('keeps shared client code free of feature imports', () => {
    const shared = sources.filter((path) => /src\/(components|lib|config)\//.test(path));
    const offences = shared.flatMap((path) =>
      importsOf(path)
        .filter((target) => target.startsWith('@/features/') || target.startsWith('@/app/'))
        .map((target) => `${relative(SRC, path)} -> ${target}`),
    );
    expect(offences).toEqual([]);
  });

  it('names files in kebab-case', () => {
    const bad = filesUnder(SRC)
      .map((path) => relative(SRC, path).split('/').pop() ?? '')
      .filter((name) => !/^[a-z0-9]+(-[a-z0-9]+)*(\.[a-z0-9]+)+$/.test(name));
    expect(bad).toEqual([]);
  });
});
