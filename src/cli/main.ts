/**
 * The command line: parse the arguments (Node's own parser), run a command,
 * set the exit code. Messages go to stderr, progress to stdout.
 */
import { parseArgs } from 'node:util'
import { commands, helpText } from './commands.js'
import { handleStopSignals } from './signals.js'

const write = (stream: NodeJS.WriteStream) => (text: string) => {
  if (text) stream.write(text)
}
const out = write(process.stdout)
const err = write(process.stderr)

async function main(argv: readonly string[]): Promise<number> {
  const [name, ...rest] = argv
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    out(helpText(rest[0]))
    return name === undefined ? 2 : 0
  }
  if (name === '--version' || name === '-v') {
    const { TOOL } = await import('../version.js')
    out(`${TOOL.name} ${TOOL.version}\n`)
    return 0
  }
  const command = commands.find((c) => c.name === name)
  if (!command) {
    err(`linkwright: unknown command \`${name}\`\n\n${helpText()}`)
    return 2
  }
  let parsed: ReturnType<typeof parseArgs>
  try {
    parsed = parseArgs({
      args: [...rest],
      allowPositionals: true,
      strict: true,
      options: Object.fromEntries(command.options.map((o) => [o.name, { type: o.type }])),
    })
  } catch (error) {
    err(`linkwright ${name}: ${error instanceof Error ? error.message : String(error)}\n\n${helpText(name)}`)
    return 2
  }
  const values = parsed.values as Record<string, string | boolean | undefined>
  if (values.help) {
    out(helpText(name))
    return 0
  }
  if (name === 'init') {
    const { initCommand } = await import('./init-command.js')
    return initCommand(parsed.positionals, out, err)
  }
  if (name === 'compare') {
    const { compareCommand } = await import('./compare-command.js')
    return compareCommand(parsed.positionals, values.json === true, out, err)
  }
  if (name === 'verify') {
    const { verifyCommand } = await import('./verify-command.js')
    return verifyCommand(parsed.positionals, out, err)
  }
  const paths = parsed.positionals.length > 0 ? parsed.positionals : ['reports']
  if (name === 'check') {
    const { checkCommand } = await import('./check-command.js')
    return checkCommand({ paths, quiet: values.quiet === true }, out, err)
  }
  if (name === 'serve') {
    const port = Number(values.port ?? 8710)
    if (!Number.isInteger(port) || port < 0 || port > 65535) {
      err(`linkwright serve: --port must be a port number, got ${String(values.port)}\n`)
      return 2
    }
    const { serveCommand } = await import('./serve-command.js')
    return serveCommand({ paths, out: typeof values.out === 'string' ? values.out : 'out', port }, out, err)
  }
  const paper = typeof values.paper === 'string' ? values.paper : null
  if (paper !== null && !/^(a4|letter)$/i.test(paper)) {
    err(`linkwright build: --paper must be A4 or Letter, got ${paper}\n`)
    return 2
  }
  const { buildCommand } = await import('./build-command.js')
  return buildCommand(
    {
      paths,
      out: typeof values.out === 'string' ? values.out : 'out',
      pdf: values['no-pdf'] !== true,
      paper: paper === null ? null : /^a4$/i.test(paper) ? 'A4' : 'Letter',
      browser: typeof values.browser === 'string' ? values.browser : null,
      quiet: values.quiet === true,
      force: values.force === true,
      since: typeof values.since === 'string' ? values.since : null,
    },
    out,
    err,
  )
}

handleStopSignals(err)
main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code
  },
  (error: unknown) => {
    err(`linkwright: internal error: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`)
    process.exitCode = 70
  },
)
