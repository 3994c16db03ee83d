// Draws the installed app's icons (192 and 512 px PNG) from our own mark, src/assets/icons/
// stepstock-mark.svg, with Debian's Chromium. Run once after changing the mark, and commit the PNGs:
//   npx tsx test/support/make-app-icons.ts
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { chromium } from 'playwright-core';

const ICONS = path.resolve(__dirname, '..', '..', 'src', 'assets', 'icons');
const SIZES = [192, 512];

async function main(): Promise<void> {
  const svg = readFileSync(path.join(ICONS, 'stepstock-mark.svg'), 'utf8');
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu'],
  });
  try {
    for (const size of SIZES) {
      const page = await browser.newPage({ viewport: { width: size, height: size } });
      const sized = svg.replace('<svg ', `<svg width="${size}" height="${size}" `);
      await page.setContent(`<html><body style="margin:0;overflow:hidden">${sized}</body></html>`);
      await page.screenshot({ path: path.join(ICONS, `stepstock-${size}.png`) });
      await page.close();
    }
  } finally {
    await browser.close();
  }
}

void main();
