import { chromium, type Browser } from 'playwright-core';

/**
 * Debian's Chromium, headless; never a downloaded browser. Playwright gives the launch a fresh,
 * temporary profile; each test opens its own context (cookies not shared).
 */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}
