/**
 * A table block as CSV (RFC 4180): one header row of `label (unit)`, the rows as
 * printed in the package (the same fixed decimals per column), and the marker
 * of each marked row (dead centre, toggle, limit) in a last column.
 */
import type { TableOutcome } from '../notes/block-kinds/kind.js'

function field(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

/** The table as CSV text, lines ending in CRLF as RFC 4180 asks. */
export function tableCsv(table: TableOutcome): string {
  const header = [...table.columns.map((c) => (c.unit ? `${c.label} (${c.unit})` : c.label)), 'marker']
  // Numbers as a spreadsheet reads them: ASCII minus, and no dash where a value has none.
  const number = (cell: string) => (cell === '—' ? '' : cell.replace(/\u2212/g, '-'))
  const rows = table.rows.map((row) => [...row.cells.map(number), row.marker ?? ''])
  return `${[header, ...rows].map((cells) => cells.map(field).join(',')).join('\r\n')}\r\n`
}

/** Where a table block's CSV goes in its package. */
export function tableCsvPath(blockId: string | null, index: number): string {
  return `tables/${blockId ?? `table-${index + 1}`}.csv`
}
