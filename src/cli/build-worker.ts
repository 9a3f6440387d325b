/**
 * A build worker: takes notes from the main thread one at a time and answers
 * with each built note as plain data (see build-one.ts).
 */
import { parentPort } from 'node:worker_threads'
import { buildOne, type BuildJob } from './build-one.js'

parentPort?.on('message', (job: BuildJob) => {
  void buildOne(job).then((reply) => parentPort!.postMessage(reply))
})
