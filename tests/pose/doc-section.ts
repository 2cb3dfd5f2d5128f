import { readFileSync, writeFileSync } from 'node:fs';

/**
 * Replaces the section between `<!-- NAME:start -->` and `<!-- NAME:end -->` of a generated document
 * (docs/accuracy.md), or appends it when the file has none; `section` carries its own markers.
 */
export function writeDocSection(file: string, name: string, section: string): void {
  const startMark = `<!-- ${name}:start -->`;
  const endMark = `<!-- ${name}:end -->`;
  const doc = readFileSync(file, 'utf8');
  const start = doc.indexOf(startMark);
  const end = doc.indexOf(endMark);
  const next =
    start >= 0 && end > start
      ? `${doc.slice(0, start)}${section}${doc.slice(end + endMark.length)}`
      : `${doc.trimEnd()}\n\n${section}\n`;
  writeFileSync(file, next);
}
