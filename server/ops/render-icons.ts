// Renders src/public/icons/rimelog.svg to the PNG sizes the web manifest and browsers ask for.
// Run by hand after changing the mark: `npx tsx server/ops/render-icons.ts` (needs Debian's chromium).
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { chromium } from 'playwright-core';
import { projectRoot } from '../config';

const iconsDir = path.join(projectRoot, 'src/public/icons');
const sizes = [48, 180, 192, 512];

async function main(): Promise<void> {
  const svg = await readFile(path.join(iconsDir, 'rimelog.svg'), 'utf8');
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox'] });
  try {
    const page = await browser.newPage();
    const shoot = async (size: number, padding: number, file: string) => {
      await page.setViewportSize({ width: size, height: size });
      const inner = size - 2 * padding;
      await page.setContent(
        `<body style="margin:0;background:#0f5c9e"><div style="padding:${padding}px">` +
          svg.replace('<svg ', `<svg width="${inner}" height="${inner}" `) +
          '</div></body>',
      );
      await page.screenshot({ path: path.join(iconsDir, file), omitBackground: padding === 0 });
    };
    for (const size of sizes) await shoot(size, 0, `icon-${size}.png`);
    // Maskable icons must keep the mark inside the central 80 % safe zone.
    await shoot(512, 52, 'icon-maskable-512.png');
  } finally {
    await browser.close();
  }
}

void main();
