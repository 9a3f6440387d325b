/**
 * `linkwright serve`: live preview while writing a note. The notes are built
 * (HTML only) into the output folder, which is served on the loopback
 * interface only; the notes and their data are watched, a change rebuilds
 * (the incremental build leaves the unchanged packages alone), and open pages
 * reload. The build's messages are printed in the terminal and shown at the
 * top of every served page with file, line and column. Nothing outside the
 * output folder is served.
 */
import { existsSync, readFileSync, realpathSync, statSync, watch, type FSWatcher } from 'node:fs'
import { createServer, type ServerResponse } from 'node:http'
import { extname, join, resolve, sep } from 'node:path'
import { buildCommand, type BuildOptions } from './build-command.js'

const TYPES: Readonly<Record<string, string>> = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.woff2': 'font/woff2',
  '.pdf': 'application/pdf',
  '.csv': 'text/csv; charset=utf-8',
  '.png': 'image/png',
}

const EVENTS = '/__linkwright/events'

const esc = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')

// The preview's own script: the page knows the build it shows; the server says the latest one when the
// page connects and after each build, so a build that finished while the page was loading is not missed.
const reload = (version: number) => `<script>new EventSource('${EVENTS}').onmessage = (e) => { if (Number(e.data) !== ${version}) location.reload() }</script>`

/** Options of the serve command. */
export interface ServeOptions {
  readonly paths: readonly string[]
  readonly out: string
  readonly port: number
}

/** Run the preview until the process is stopped; resolves with an exit code only when it cannot start. */
export async function serveCommand(options: ServeOptions, out: (text: string) => void, err: (text: string) => void): Promise<number> {
  const buildOptions: BuildOptions = { paths: options.paths, out: options.out, pdf: false, paper: null, browser: null, quiet: false }
  let report = ''
  let version = 0
  const clients = new Set<ServerResponse>()
  let building: Promise<void> | null = null
  let again = false
  const rebuild = async (): Promise<void> => {
    if (building) {
      again = true
      return building
    }
    building = (async () => {
      do {
        again = false
        let text = ''
        let said = ''
        const started = performance.now()
        const code = await buildCommand(buildOptions, (t) => (said += t), (t) => (text += t))
        const before = report
        report = code === 0 || code === 3 ? '' : text
        // Nothing built and nothing new to say (a save that changed nothing): the pages stay as they are.
        const built = Number(/^built (\d+),/m.exec(said)?.[1] ?? 0)
        if (built === 0 && report === before && version > 0) continue
        version++
        out(`${new Date().toISOString().slice(11, 19)} built ${built} in ${(performance.now() - started).toFixed(0)} ms${report ? ' with problems:' : ''}\n`)
        if (report) err(report)
        for (const client of clients) client.write(`data: ${version}\n\n`)
      } while (again)
    })()
    try {
      await building
    } finally {
      building = null
    }
  }
  await rebuild()
  const root = realpathSync(options.out)

  const server = createServer((request, response) => {
    const url = new URL(request.url ?? '/', 'http://127.0.0.1')
    if (url.pathname === EVENTS) {
      response.writeHead(200, { 'content-type': 'text/event-stream', 'cache-control': 'no-store', connection: 'keep-alive' })
      response.write(`: linkwright preview\n\ndata: ${version}\n\n`)
      clients.add(response)
      request.on('close', () => clients.delete(response))
      return
    }
    let path: string
    try {
      path = resolve(root, `.${decodeURIComponent(url.pathname)}`)
      if (existsSync(path) && statSync(path).isDirectory()) path = join(path, 'index.html')
      path = existsSync(path) ? realpathSync(path) : path
    } catch {
      response.writeHead(400).end('bad path')
      return
    }
    // Only the output folder, links resolved: nothing else on the machine.
    if (path !== root && !path.startsWith(root + sep)) {
      response.writeHead(403, { 'content-type': 'text/plain; charset=utf-8' }).end('outside the output folder')
      return
    }
    if (!existsSync(path)) {
      response.writeHead(404, { 'content-type': 'text/plain; charset=utf-8' }).end('not found')
      return
    }
    const type = TYPES[extname(path).toLowerCase()] ?? 'application/octet-stream'
    let body: Buffer | string = readFileSync(path)
    if (type.startsWith('text/html')) {
      const banner = report
        ? `<div id="lw-preview-problems" style="position:sticky;top:0;z-index:9;background:#fbe8e8;color:#a11d21;border-bottom:2px solid #a11d21;padding:8px 12px;font:12px/1.4 monospace;white-space:pre-wrap">${esc(report)}</div>`
        : ''
      body = body.toString('utf8').replace(/<body([^>]*)>/, `<body$1>${banner}`).replace('</body>', `${reload(version)}</body>`)
    }
    response.writeHead(200, { 'content-type': type, 'cache-control': 'no-store' }).end(body)
  })
  const listening = await new Promise<string | null>((done) => {
    server.once('error', (error) => done(error.message))
    server.listen(options.port, '127.0.0.1', () => done(null))
  })
  if (listening !== null) {
    err(`linkwright serve: cannot listen on 127.0.0.1:${options.port} (${listening})\n`)
    return 2
  }
  const address = server.address()
  const port = typeof address === 'object' && address ? address.port : options.port
  out(`previewing ${options.out}/ at http://127.0.0.1:${port}/ (loopback only); watching ${options.paths.join(', ')}; Ctrl-C stops\n`)

  // Notes (.md) and load tables (.csv): a change rebuilds; the output folder and hidden files are not watched.
  const watchers: FSWatcher[] = []
  let timer: NodeJS.Timeout | undefined
  const changed = (full: string) => {
    if (full === root || full.startsWith(root + sep) || full.split(/[\\/]/).some((p) => p.startsWith('.'))) return
    if (!/\.(md|csv)$/i.test(full)) return
    clearTimeout(timer)
    timer = setTimeout(() => void rebuild(), 30)
  }
  for (const path of options.paths) {
    if (!existsSync(path)) continue
    const folder = statSync(path).isDirectory()
    watchers.push(watch(path, { recursive: folder }, (_, name) => changed(folder && name ? resolve(path, String(name)) : resolve(path))))
  }
  return new Promise<number>(() => undefined)
}
