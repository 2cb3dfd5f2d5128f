// Runs every tests/bench/*.bench.ts in turn with tsx; each prints its own figures.
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));
const root = fileURLToPath(new URL('../..', import.meta.url));
const tsx = `${root}node_modules/tsx/dist/cli.mjs`;
const only = process.argv.slice(2);
const benches = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
  .sort();

let failed = 0;
for (const file of benches) {
  process.stdout.write(`\n== ${file}\n`);
  const r = spawnSync(process.execPath, [tsx, `${here}${file}`], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) {
    failed++;
    process.stdout.write(`!! ${file} exited with ${r.status ?? r.signal}\n`);
  }
}
process.stdout.write(`\n${benches.length - failed} of ${benches.length} benchmarks ran\n`);
process.exitCode = failed > 0 ? 1 : 0;
