import { mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser } from 'playwright-core';

export const TEST_OUTPUT = fileURLToPath(new URL('../../test-output', import.meta.url));

export const PHONE = { width: 375, height: 740 };
export const WIDE = { width: 1280, height: 800 };

/** Debian's Chromium, headless, with no network chatter (this machine's network is closed). */
export async function launchBrowser(): Promise<Browser> {
  mkdirSync(TEST_OUTPUT, { recursive: true });
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/** Signs in through the real form and waits for the app shell. */
export async function signInThroughForm(page: import('playwright-core').Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.locator('[data-testid="sign-in-email"]:visible').fill(email);
  await page.locator('[data-testid="sign-in-password"]:visible').fill(password);
  await page.locator('[data-testid="sign-in-submit"]:visible').click();
  await page.locator('[data-testid="screen-formulas"]:visible').waitFor();
}
