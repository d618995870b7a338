import { chromium, type Browser } from 'playwright-core';

export const chromiumPath = process.env['CHROMIUM_PATH'] ?? '/usr/bin/chromium';

/** Debian's Chromium, headless, with the background traffic a closed network would refuse turned off. */
export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}
