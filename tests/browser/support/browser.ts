/** Debian's Chromium driven by playwright-core, in a fresh profile that nothing else has touched. */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type BrowserContext, chromium } from 'playwright-core';

/** Where Debian installs Chromium; `npx playwright install` cannot run on this kind of machine. */
export const chromiumPath = process.env['CHROMIUM_PATH'] ?? '/usr/bin/chromium';

/** Flags that keep Chromium headless and quiet: no GPU, no QUIC, no background calls home. */
export const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** A browser context and the way to dispose of it with its profile. */
export interface TestBrowser {
  readonly context: BrowserContext;
  close(): Promise<void>;
}

/** Launches Chromium with a new, empty user data directory, removed again on close(). */
export async function launchBrowser(viewport = { width: 1440, height: 900 }): Promise<TestBrowser> {
  const profile = await mkdtemp(join(tmpdir(), 'loadwright-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: chromiumPath,
    args: chromiumArgs,
    viewport,
    locale: 'en-GB',
    timezoneId: 'UTC',
  });
  return {
    context,
    async close() {
      await context.close();
      await rm(profile, { recursive: true, force: true });
    },
  };
}
