import { mkdtempSync, mkdirSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { chromium, type BrowserContext } from 'playwright-core'

export const artifactsDir = fileURLToPath(new URL('../artifacts/', import.meta.url))

// The flags CI uses for Debian's chromium: no sandbox (root), no GPU, no network side traffic.
export const CHROMIUM_FLAGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync'
]

/** Debian's chromium with a fresh user-data dir; `close()` removes the dir. */
export async function launchBrowser(): Promise<{ context: BrowserContext, close: () => Promise<void> }> {
  const userDataDir = mkdtempSync(join(tmpdir(), 'sheaf-chromium-'))
  mkdirSync(artifactsDir, { recursive: true })
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_FLAGS,
    viewport: { width: 1280, height: 860 }
  })
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(userDataDir, { recursive: true, force: true })
    }
  }
}
