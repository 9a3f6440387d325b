/**
 * Notes built in worker threads up to the core count, each worker one note at
 * a time; the answers come back in the notes' order. Without the bundle's
 * worker file (running from source) or with one note to build, in process.
 */
import { existsSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import { join } from 'node:path'
import { Worker } from 'node:worker_threads'
import { buildOne, type BuildJob, type BuildReply } from './build-one.js'
import { packageRoot } from './paths.js'

/** Fewest notes per worker thread: below that, the notes build in process. */
const MIN_PER_WORKER = 4

/** How many threads build notes: $LINKWRIGHT_WORKERS, else the core count. */
export function workerCount(env: NodeJS.ProcessEnv = process.env): number {
  const asked = Number(env.LINKWRIGHT_WORKERS)
  return Number.isInteger(asked) && asked >= 1 ? asked : availableParallelism()
}

/**
 * Build every job; `done` takes each answer as it comes (in any order), so the
 * caller can write it out and let it go. Small sets build in process: a worker's
 * start (loading the bundle, about a second) costs more than it saves.
 */
export async function buildAll(jobs: readonly BuildJob[], done: (index: number, reply: BuildReply) => void): Promise<void> {
  const script = join(packageRoot(), 'dist', 'build-worker.js')
  const threads = Math.min(workerCount(), Math.floor(jobs.length / MIN_PER_WORKER))
  if (threads <= 1 || !existsSync(script)) {
    for (const [i, job] of jobs.entries()) done(i, await buildOne(job))
    return
  }
  const answered = new Array<boolean>(jobs.length).fill(false)
  let next = 0
  const workers = Array.from({ length: threads }, () => new Worker(script))
  try {
    await Promise.all(
      workers.map(
        (worker) =>
          new Promise<void>((resolve, reject) => {
            let current = -1
            const take = () => {
              if (next >= jobs.length) return resolve()
              current = next++
              worker.postMessage(jobs[current])
            }
            worker.on('message', (reply: BuildReply) => {
              answered[current] = true
              done(current, reply)
              take()
            })
            worker.on('error', reject)
            worker.on('exit', (code) => {
              if (current >= 0 && !answered[current]) reject(new Error(`a build worker stopped (exit ${code}) while building ${jobs[current]!.shown}`))
            })
            take()
          }),
      ),
    )
  } finally {
    await Promise.all(workers.map((w) => w.terminate()))
  }
}
