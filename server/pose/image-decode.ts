import { readFile } from 'node:fs/promises';
import { createCanvas, loadImage } from '@napi-rs/canvas';
import type { PixelFrame } from '@shared/pose/pose-detector';

/** Decodes a PNG or JPEG (also WebP, GIF's first frame) into RGBA pixels. Throws on unreadable data. */
export async function decodeImage(bytes: Buffer): Promise<PixelFrame> {
  const image = await loadImage(bytes);
  const { width, height } = image;
  if (!width || !height) throw new Error('image has no pixels');
  const canvas = createCanvas(width, height);
  const ctx = canvas.getContext('2d');
  ctx.drawImage(image, 0, 0);
  const data = ctx.getImageData(0, 0, width, height).data;
  return { data, width, height, channels: 4 };
}

export async function decodeImageFile(path: string): Promise<PixelFrame> {
  return decodeImage(await readFile(path));
}
