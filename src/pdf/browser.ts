/**
 * Finding and starting Chromium: an explicit path, then $LINKWRIGHT_CHROMIUM,
 * then the usual install paths (Debian's /usr/bin/chromium first). The only
 * module that starts a browser.
 */
import { accessSync, constants, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Browser } from 'puppeteer-core'

/** Where Chromium is usually installed, most likely first. */
export const BROWSER_PATHS: readonly string[] = [
  '/usr/bin/chromium',
  '/usr/bin/chromium-browser',
  '/usr/lib/chromium/chromium',
  '/snap/bin/chromium',
  '/usr/bin/google-chrome-stable',
  '/usr/bin/google-chrome',
  '/Applications/Chromium.app/Contents/MacOS/Chromium',
  '/Applications/Google Chrome.app/Contents/MacOS/Google Chrome',
]

/** How to get a browser, said once when none is found. */
export const INSTALL_HINT =
  'No Chromium found, so no PDF was printed (the HTML packages are built). Install it (Debian: `apt-get install chromium`) or point `--browser` or the LINKWRIGHT_CHROMIUM environment variable at a Chromium or Chrome executable; `--no-pdf` skips printing.'

function executable(path: string): boolean {
  try {
    accessSync(path, constants.X_OK)
    return true
  } catch {
    return false
  }
}

/** The browser to print with, or null. An explicit path that is not executable is refused (null). */
export function findBrowser(explicit?: string | null, env: NodeJS.ProcessEnv = process.env): string | null {
  if (explicit) return executable(explicit) ? explicit : null
  const fromEnv = env.LINKWRIGHT_CHROMIUM
  if (fromEnv) return executable(fromEnv) ? fromEnv : null
  return BROWSER_PATHS.find(executable) ?? null
}

/** Chromium flags for a headless run on a closed machine (no GPU, no background network). */
export const BROWSER_FLAGS: readonly string[] = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-default-apps',
  '--disable-extensions',
  '--no-first-run',
  '--disable-quic',
  '--font-render-hinting=none',
]

/** A running browser and how to close it for good (profile folder removed). */
export interface RunningBrowser {
  readonly browser: Browser
  close(): Promise<void>
}

/** Start Chromium headless with a fresh profile. */
export async function launchBrowser(executablePath: string): Promise<RunningBrowser> {
  const { default: puppeteer } = await import('puppeteer-core')
  const profile = mkdtempSync(join(tmpdir(), 'linkwright-chromium-'))
  const browser = await puppeteer.launch({
    executablePath,
    headless: true,
    userDataDir: profile,
    args: [...BROWSER_FLAGS],
  })
  let closed = false
  return {
    browser,
    async close() {
      if (closed) return
      closed = true
      await browser.close().catch(() => undefined)
      rmSync(profile, { recursive: true, force: true })
    },
  }
}
