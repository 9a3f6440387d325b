/**
 * Finding and starting Chromium: an explicit path, then $LINKWRIGHT_CHROMIUM,
 * then the usual install paths (Debian's /usr/bin/chromium first). The only
 * module that starts a browser.
 */
import { accessSync, constants, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
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

/** Longest wait for the browser to start, ms ($LINKWRIGHT_BROWSER_TIMEOUT in seconds overrides). */
export function startTimeout(env: NodeJS.ProcessEnv = process.env): number {
  const seconds = Number(env.LINKWRIGHT_BROWSER_TIMEOUT)
  return Number.isFinite(seconds) && seconds > 0 ? Math.round(seconds * 1000) : 20_000
}

const PROFILE_PREFIX = 'linkwright-chromium-'

/** Browsers this process started (or is starting) and has not closed: killed at once on a signal. */
const running = new Set<{ kill(): void; profile: string }>()

/** Kill every browser this process started and remove its profile. Synchronous, for signal handlers. */
export function killBrowsers(): void {
  for (const { kill, profile } of running) {
    kill()
    removeProfile(profile)
  }
  running.clear()
}

/** Remove a profile; a browser process that is just ending may still write into it for a moment. */
function removeProfile(profile: string): void {
  rmSync(profile, { recursive: true, force: true, maxRetries: 10, retryDelay: 50 })
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0)
    return true
  } catch (error) {
    return (error as { code?: string }).code === 'EPERM'
  }
}

/**
 * Remove what a killed run left: profiles of processes that no longer run, and
 * any browser still using one (found by its command line, where /proc exists).
 */
export function removeStaleProfiles(folder: string = tmpdir()): string[] {
  const removed: string[] = []
  let names: string[]
  try {
    names = readdirSync(folder)
  } catch {
    return removed
  }
  for (const name of names) {
    const match = new RegExp(`^${PROFILE_PREFIX}(\\d+)-`).exec(name)
    if (!match || alive(Number(match[1]))) continue
    const profile = join(folder, name)
    for (const pid of processesUsing(profile)) {
      try {
        process.kill(pid, 'SIGKILL')
      } catch {
        // gone meanwhile
      }
    }
    removeProfile(profile)
    removed.push(profile)
  }
  return removed
}

/** Processes whose parent is `parent` (where /proc exists). */
function childrenOf(parent: number): number[] {
  const pids: number[] = []
  for (const entry of procEntries()) {
    try {
      // The parent id is the fourth field after the command name in parentheses.
      const stat = readFileSync(join('/proc', entry, 'stat'), 'latin1')
      if (Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === parent) pids.push(Number(entry))
    } catch {
      // ended
    }
  }
  return pids
}

function procEntries(): string[] {
  try {
    return readdirSync('/proc').filter((e) => /^\d+$/.test(e))
  } catch {
    return []
  }
}

function processesUsing(profile: string): number[] {
  const pids: number[] = []
  for (const entry of procEntries()) {
    try {
      if (readFileSync(join('/proc', entry, 'cmdline'), 'latin1').includes(`--user-data-dir=${profile}`)) pids.push(Number(entry))
    } catch {
      // ended, or not ours to read
    }
  }
  return pids
}

/**
 * Start Chromium headless with a fresh profile, waiting at most `timeoutMs`.
 * The DevTools connection is a pipe, so the browser ends when this process
 * ends, even by SIGKILL; Ctrl-C and SIGTERM are the command line's to handle.
 */
export async function launchBrowser(executablePath: string, timeoutMs: number = startTimeout()): Promise<RunningBrowser> {
  const { default: puppeteer } = await import('puppeteer-core')
  removeStaleProfiles()
  const profile = mkdtempSync(join(tmpdir(), `${PROFILE_PREFIX}${process.pid}-`))
  // Known from now on: a signal during the start kills the browser by its profile.
  let child: ReturnType<Browser['process']> = null
  const entry = {
    kill: () => {
      for (const pid of [...(child?.pid ? [child.pid] : []), ...processesUsing(profile)]) {
        try {
          process.kill(pid, 'SIGKILL')
        } catch {
          // already gone
        }
      }
    },
    profile,
  }
  running.add(entry)
  let browser: Browser
  // Puppeteer's own start-up timeout does not cover a pipe connection: a browser that
  // has not answered in time is killed, which ends the launch at once.
  let late = false
  const watchdog = setTimeout(() => {
    late = true
    for (const pid of [...processesUsing(profile), ...childrenOf(process.pid)]) {
      try {
        process.kill(pid, 'SIGKILL')
      } catch {
        // gone meanwhile
      }
    }
  }, timeoutMs)
  try {
    browser = await puppeteer.launch({
      executablePath,
      headless: true,
      userDataDir: profile,
      args: [...BROWSER_FLAGS],
      pipe: true,
      // Chromium's own temporary files go in the profile, so removing it leaves nothing behind,
      // unless the path is so long that its socket paths would pass the system's limit.
      env: profile.length <= 60 ? { ...process.env, TMPDIR: profile } : process.env,
      timeout: timeoutMs,
      protocolTimeout: 120_000,
      handleSIGINT: false,
      handleSIGTERM: false,
      handleSIGHUP: false,
    })
  } catch (error) {
    running.delete(entry)
    removeProfile(profile)
    if (late) throw new Error(`it did not start within ${timeoutMs / 1000} s`)
    throw error
  } finally {
    clearTimeout(watchdog)
  }
  child = browser.process()
  let closed = false
  return {
    browser,
    async close() {
      if (closed) return
      closed = true
      // A browser that does not close in a few seconds is killed.
      let timer: NodeJS.Timeout | undefined
      await Promise.race([browser.close().catch(() => undefined), new Promise((done) => (timer = setTimeout(done, 5_000)))])
      clearTimeout(timer)
      entry.kill()
      running.delete(entry)
      removeProfile(profile)
    },
  }
}
