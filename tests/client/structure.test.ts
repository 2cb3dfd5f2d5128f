import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// File names are kebab-case. (Which layer may import which is the linter's
// job: eslint.config.js, tested in tests/lint.)
const SRC = join(process.cwd(), 'src');

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? filesUnder(path) : [path];
  });
}

const sources = filesUnder(SRC).filter((path) => /\.(ts|tsx)$/.test(path));

describe('client structure', () => {
  it('finds the sources it checks', () => {
    expect(sources.length).toBeGreaterThan(40);
  });

  it('names files in kebab-case', () => {
    const bad = filesUnder(SRC)
      .map((path) => relative(SRC, path).split('/').pop() ?? '')
      .filter((name) => !/^[a-z0-9]+(-[a-z0-9]+)*(\.[a-z0-9]+)+$/.test(name));
    expect(bad).toEqual([]);
  });
});
