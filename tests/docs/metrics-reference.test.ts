import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { METRIC_DEFINITIONS, METRIC_KEYS } from '@shared/metrics';

// docs/metrics.md is the reference the code cites; its metric table must name every key the code
// computes, with the same unit and view, and nothing else.
const doc = readFileSync('docs/metrics.md', 'utf8');
const section = doc.slice(doc.indexOf('## Metrics'), doc.indexOf('## Over a clip'));
const rows = section
  .split('\n')
  .filter((line) => line.startsWith('| `'))
  .map((line) => line.split('|').map((cell) => cell.trim()));

const UNIT_WORDS: Record<string, string> = { deg: 'deg', ratio: 'ratio', shinLengths: 'shin lengths' };

describe('docs/metrics.md', () => {
  const documented = new Map<string, { unit: string; view: string }>();
  for (const [, keys, unit, view] of rows) {
    for (const key of keys.match(/`([a-zA-Z]+)`/g) ?? []) documented.set(key.slice(1, -1), { unit, view });
  }

  it('documents exactly the metric keys the code computes', () => {
    expect([...documented.keys()].sort()).toEqual([...METRIC_KEYS].sort());
  });

  it('gives each metric the unit and view of its definition in code', () => {
    for (const key of METRIC_KEYS) {
      const def = METRIC_DEFINITIONS[key];
      const views = def.views.length === 2 ? 'both' : def.views[0];
      expect({ key, unit: documented.get(key)?.unit, view: documented.get(key)?.view }).toEqual({
        key,
        unit: UNIT_WORDS[def.unit] ?? def.unit,
        view: views,
      });
    }
  });
});
