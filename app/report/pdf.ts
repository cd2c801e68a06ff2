import { existsSync } from 'node:fs';
import type { Browser } from 'playwright-core';
import { KeepclearError } from '../../core/errors.js';

/**
 * PDF through headless Chromium (Debian's `chromium`), driven by playwright-core: the same HTML
 * the browser shows becomes the PDF, so there is one layout to maintain. KEEPCLEAR_CHROMIUM
 * points elsewhere (e.g. on a desktop without /usr/bin/chromium).
 */
export const chromiumPath = (): string => process.env.KEEPCLEAR_CHROMIUM || '/usr/bin/chromium';

/** Headless, sandbox off (containers, CI), and nothing that phones home. */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

/** Why Chromium cannot be used, or null when it is there. */
export function chromiumMissing(): string | null {
  const path = chromiumPath();
  return existsSync(path)
    ? null
    : `headless Chromium not found at ${path} — a PDF needs it: install it (Debian/Ubuntu: apt-get install -y chromium), ` +
        'or set KEEPCLEAR_CHROMIUM to its path, or write the report as .html';
}

export async function launchChromium(): Promise<Browser> {
  const missing = chromiumMissing();
  if (missing) throw new KeepclearError('NOT_FOUND', missing);
  // Loaded on demand: playwright-core takes over a second to import, and only PDFs need it.
  const { chromium } = await import('playwright-core');
  try {
    return await chromium.launch({ executablePath: chromiumPath(), args: CHROMIUM_ARGS });
  } catch (e) {
    throw new KeepclearError('INTERNAL', `headless Chromium at ${chromiumPath()} failed to start: ${(e as Error).message.split('\n')[0]}`);
  }
}

/**
 * Prints a self-contained HTML page to A4 PDF. Every network request is refused: a report must
 * not depend on (or leak to) anything outside the file.
 */
export async function htmlToPdf(html: string): Promise<Buffer> {
  const browser = await launchChromium();
  try {
    const page = await browser.newPage();
    await page.route('**/*', (route) => route.abort());
    await page.setContent(html, { waitUntil: 'load' });
    return await page.pdf({ format: 'A4', printBackground: true, preferCSSPageSize: true });
  } finally {
    await browser.close();
  }
}
