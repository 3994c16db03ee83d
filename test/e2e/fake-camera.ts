// A fake camera for Chromium: a YUV4MPEG2 file that `--use-file-for-fake-video-capture` plays as the
// device's picture, made from one of our own printed labels drawn in the page.
import { writeFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

export const CAMERA_WIDTH = 640;
export const CAMERA_HEIGHT = 480;

/**
 * The luma (Y) of each pixel of a label's barcode drawn dark-on-white across the middle of a
 * camera-sized picture. The SVG is the one the label page prints, drawn at its own proportions on a
 * canvas, so the fake camera sees what a printed label shows.
 */
export async function labelLuma(page: Page, svgSelector: string): Promise<Buffer> {
  const base64 = (await page.evaluate(`(async () => {
    const W = ${CAMERA_WIDTH}, H = ${CAMERA_HEIGHT};
    const svg = document.querySelector(${JSON.stringify(svgSelector)});
    if (!svg) throw new Error('no barcode on the page');
    const xml = new XMLSerializer().serializeToString(svg);
    const img = new Image();
    img.src = 'data:image/svg+xml;charset=utf-8,' + encodeURIComponent(xml);
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = W;
    canvas.height = H;
    const ctx = canvas.getContext('2d');
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, W, H);
    ctx.imageSmoothingEnabled = false;
    ctx.drawImage(img, Math.round(W * 0.04), Math.round(H * 0.3), Math.round(W * 0.92), Math.round(H * 0.4));
    const rgba = ctx.getImageData(0, 0, W, H).data;
    // ITU-R BT.601 luma in studio range: Y = 16 + (65.481 R + 128.553 G + 24.966 B) / 255.
    let out = '';
    for (let i = 0; i < W * H; i++) {
      const r = rgba[4 * i], g = rgba[4 * i + 1], b = rgba[4 * i + 2];
      out += String.fromCharCode(Math.round(16 + (65.481 * r + 128.553 * g + 24.966 * b) / 255));
    }
    return btoa(out);
  })()`)) as string;
  return Buffer.from(base64, 'base64');
}

/**
 * Writes a YUV4MPEG2 file of `frames` identical 4:2:0 frames: the luma plane as given, both chroma
 * planes at 128 (no colour). Header and FRAME markers as the format defines them.
 */
export function writeY4m(file: string, luma: Buffer, frames = 10): void {
  const w = CAMERA_WIDTH;
  const h = CAMERA_HEIGHT;
  if (luma.length !== w * h) throw new Error(`luma is ${luma.length} bytes, not ${w * h}`);
  const chroma = Buffer.alloc((w / 2) * (h / 2) * 2, 128);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), luma, chroma]);
  const header = Buffer.from(`YUV4MPEG2 W${w} H${h} F10:1 Ip A1:1 C420\n`);
  writeFileSync(file, Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]));
}
