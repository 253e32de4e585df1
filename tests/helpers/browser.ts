import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

/** Debian's Chromium with a fresh profile; never a downloaded browser. */
export async function launchBrowser(options: { javaScriptEnabled?: boolean } = {}): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const profile = mkdtempSync(path.join(tmpdir(), 'sheathwise-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1280, height: 800 },
    javaScriptEnabled: options.javaScriptEnabled ?? true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    close: async () => {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
