/**
 * `linkwright init [folder]`: a starter for a new design repository: a notes
 * folder with one note that builds (a slider-crank with its inputs and
 * sources, a check, a table, a chart, assumptions), a data folder, and a
 * .gitignore for the output. Writes only files that are not there yet.
 */
import { existsSync, mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'

const NOTE = `---
title: Crank drive of the new machine
number: DN-0001
revision: A
status: draft
date: git
paper: A4
units:
  system: SI
people:
  prepared: { name: Your Name, date: }
  checked: { name: "", date: }
  approved: { name: "", date: }
revisions:
  - { revision: A, description: First issue }
references:
  spec: The machine's specification (name its number and revision here).
  dwg: The drive's arrangement drawing (name its number and revision here).
---

# Crank drive of the new machine

State what the drive must do, and where each number comes from.

\`\`\`design-inputs #duty Duty from the specification
stroke_required: 80 mm ; [spec] the stroke the machine needs
speed: 60 rpm ; [spec] crank speed
\`\`\`

\`\`\`slider-crank #drive Crank, connecting rod and slider
crank: duty.stroke_required / 2 ; [dwg] crank radius for the stroke
rod: 160 mm ; [dwg] rod length, pin centres
speed: duty.speed
\`\`\`

\`\`\`checks #acceptance Acceptance checks
stroke: drive.stroke = duty.stroke_required ± 0.5 mm ; [spec] stroke tolerance
transmission: drive.transmission_angle_min >= 40 deg ; common practice, no source
\`\`\`

\`\`\`table
of: drive
quantities: position, velocity, acceleration
every: 30 deg
\`\`\`

\`\`\`chart
of: drive
series: velocity, acceleration
\`\`\`

\`\`\`assumptions
- The crank turns at a steady speed (to verify)
\`\`\`
`

const IGNORE = '# Built packages: rebuilt from the notes by `linkwright build notes`\nout/\n'

/** Run the init command; returns the exit code. */
export function initCommand(args: readonly string[], out: (text: string) => void, err: (text: string) => void): number {
  if (args.length > 1) {
    err('linkwright init: give at most one folder (default: the current one)\n')
    return 2
  }
  const root = args[0] ?? '.'
  const files: [string, string][] = [
    [join(root, 'notes', 'crank-drive.md'), NOTE],
    [join(root, 'notes', 'data', '.gitkeep'), ''],
    [join(root, '.gitignore'), IGNORE],
  ]
  let wrote = 0
  try {
    for (const [path, text] of files) {
      if (existsSync(path)) {
        out(`${path}: there already, left as it is\n`)
        continue
      }
      mkdirSync(join(path, '..'), { recursive: true })
      writeFileSync(path, text, { flag: 'wx' })
      out(`${path}: written\n`)
      wrote++
    }
  } catch (error) {
    err(`linkwright init: cannot write in ${root} (${error instanceof Error ? error.message : String(error)})\n`)
    return 4
  }
  out(wrote > 0 ? `Next: edit notes/crank-drive.md, then \`linkwright build notes\` (packages in out/).\n` : 'Nothing to write.\n')
  return 0
}
