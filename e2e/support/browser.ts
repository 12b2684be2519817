import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

/** Debian's Chromium: the tests drive the system browser, never a downloaded one. */
export const CHROMIUM = '/usr/bin/chromium';

/** Quiet, headless, self-contained: no GPU, no sandbox (containers run as root), no calls home. */
const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];

export interface BrowserSession {
  context: BrowserContext;
  /** Close the browser and delete its profile. */
  close(): Promise<void>;
}

/**
 * Launch Chromium with a fresh temporary profile (--user-data-dir, which Playwright takes as the
 * persistent-context directory). `deviceScaleFactor` lets a test check device-pixel handling.
 */
export async function launchChromium(
  options: { deviceScaleFactor?: number; width?: number; height?: number } = {},
): Promise<BrowserSession> {
  if (!existsSync(CHROMIUM))
    throw new Error(`${CHROMIUM} not found: install it with \`sudo apt-get install -y chromium\``);
  const profile = await mkdtemp(join(tmpdir(), 'stria-chromium-'));
  try {
    const context = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      headless: true,
      args: ARGS,
      viewport: { width: options.width ?? 1000, height: options.height ?? 900 },
      deviceScaleFactor: options.deviceScaleFactor ?? 1,
    });
    return {
      context,
      async close() {
        await context.close();
        await rm(profile, { recursive: true, force: true });
      },
    };
  } catch (e) {
    await rm(profile, { recursive: true, force: true });
    throw e;
  }
}
