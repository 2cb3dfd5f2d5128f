/** A name for a still: clip name, frame number, ".png". */
export function stillFileName(originalName: string, frameIndex: number): string {
  const base =
    originalName
      .replace(/\.[^./\\]+$/, '')
      .replace(/[\\/:*?"<>|]+/g, '-')
      .trim() || 'clip';
  return `${base}.frame-${String(frameIndex).padStart(5, '0')}.png`;
}
