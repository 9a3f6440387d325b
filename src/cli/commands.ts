/**
 * The commands and their options, as data: the parser and the help text both
 * read this table.
 */

/** One option of a command. */
export interface OptionSpec {
  readonly name: string
  readonly type: 'string' | 'boolean'
  readonly value?: string
  readonly description: string
  readonly default?: string | boolean
}

/** One command. */
export interface CommandSpec {
  readonly name: string
  readonly usage: string
  readonly summary: string
  readonly options: readonly OptionSpec[]
}

const help: OptionSpec = { name: 'help', type: 'boolean', description: 'show this help' }

export const commands: readonly CommandSpec[] = [
  {
    name: 'build',
    usage: 'linkwright build [paths…] [options]',
    summary: 'Evaluate design notes and write a calculation package (HTML, PDF, results.json) for each.',
    options: [
      { name: 'out', type: 'string', value: 'folder', description: 'where the packages go', default: 'out' },
      { name: 'no-pdf', type: 'boolean', description: 'write HTML and results.json only; do not start a browser' },
      { name: 'paper', type: 'string', value: 'A4|Letter', description: 'paper size of the PDF, overriding the front matter' },
      { name: 'browser', type: 'string', value: 'path', description: 'Chromium to print with (else $LINKWRIGHT_CHROMIUM, then the usual install paths)' },
      { name: 'since', type: 'string', value: 'revision', description: 'add to each package what moved since this git revision, marked in its blocks' },
      { name: 'force', type: 'boolean', description: 'rebuild every package, even those whose note, data, options and tool are unchanged' },
      { name: 'quiet', type: 'boolean', description: 'print errors only' },
      help,
    ],
  },
  {
    name: 'check',
    usage: 'linkwright check [paths…] [options]',
    summary: 'Evaluate design notes and their acceptance checks without rendering; fail on an error or a FAIL. For CI.',
    options: [{ name: 'quiet', type: 'boolean', description: 'print errors and failed checks only' }, help],
  },
  {
    name: 'serve',
    usage: 'linkwright serve [paths…] [--out out] [--port 8710]',
    summary: 'Live preview: build (HTML only), serve the packages on 127.0.0.1, rebuild and reload on each saved change.',
    options: [
      { name: 'out', type: 'string', value: 'folder', description: 'where the packages go', default: 'out' },
      { name: 'port', type: 'string', value: 'number', description: 'port on 127.0.0.1 (0: any free one)', default: '8710' },
      help,
    ],
  },
  {
    name: 'init',
    usage: 'linkwright init [folder]',
    summary: 'Start a design repository: a notes folder with a starter note that builds, and a .gitignore for out/.',
    options: [help],
  },
  {
    name: 'compare',
    usage: 'linkwright compare <note.md> <revision> [<revision>] [--json]',
    summary: 'What moved in a note between two git revisions (or one and the working tree): inputs, results, checks, blocks.',
    options: [{ name: 'json', type: 'boolean', description: 'print the changes as one JSON object' }, help],
  },
  {
    name: 'verify',
    usage: 'linkwright verify <note.md> <package folder | results.json>',
    summary: 'Recompute a note and compare it with a built package: match, or what differs (note, data, tool, results).',
    options: [help],
  },
]

/** Help text of the tool or of one command. */
export function helpText(name?: string): string {
  const command = commands.find((c) => c.name === name)
  if (!command) {
    return [
      'linkwright — Markdown design notes in, linkage design-calculation packages out.',
      '',
      'Usage: linkwright <command> [paths…] [options]',
      '',
      'Commands:',
      ...commands.map((c) => `  ${c.name.padEnd(8)}${c.summary}`),
      '',
      'Paths are notes (.md) or folders searched for notes; the default is reports/.',
      'Run `linkwright <command> --help` for the options of a command.',
      '',
      'Exit status: 0 all good; 1 a note has errors (or, for check, an acceptance check FAILs);',
      '2 the command line is wrong; 3 PDFs were asked for but no browser was found or started;',
      '4 the output folder cannot be created or written. Ctrl-C or SIGTERM: 130 or 143, nothing half-written.',
      'verify: 0 the package matches; 16 + 1 note edited, + 2 a data file changed, + 4 the tool changed,',
      '+ 8 results or checks differ.',
      '',
    ].join('\n')
  }
  const width = Math.max(...command.options.map((o) => optionWords(o).length)) + 2
  return [
    `Usage: ${command.usage}`,
    '',
    command.summary,
    '',
    'Options:',
    ...command.options.map(
      (o) => `  ${optionWords(o).padEnd(width)}${o.description}${o.default !== undefined && o.default !== false ? ` (default: ${String(o.default)})` : ''}`,
    ),
    '',
  ].join('\n')
}

function optionWords(option: OptionSpec): string {
  return `--${option.name}${option.value ? ` <${option.value}>` : ''}`
}
