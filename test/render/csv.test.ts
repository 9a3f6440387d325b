/**
 * Each table block is also written as CSV beside results.json: one header of
 * `label (unit)`, the rows as printed, numbers a spreadsheet reads (ASCII
 * minus), checked against the slider-crank's position written out here
 * (x = a cos θ + √(b² − (a sin θ − e)²), e.g. Uicker, Pennock & Shigley,
 * Theory of Machines and Mechanisms, 5th ed., §4.7, the offset slider-crank).
 */
import { describe, expect, it } from 'vitest'
import { tableCsv } from '../../src/render/csv.js'
import { build } from '../helpers/note.js'

const NOTE = `\`\`\`slider-crank #drive
crank: 40 mm
rod: 160 mm
offset: 10 mm
speed: 100 rpm
\`\`\`

\`\`\`table #motion
of: drive
quantities: position, velocity
every: 30 deg
\`\`\`
`

describe('tables as CSV', () => {
  it('should write the table block as CSV with the package, its positions those of the closed form', async () => {
    const { built } = await build(NOTE)
    expect(built.ok).toBe(true)
    const csv = built.files.get('tables/motion.csv')
    expect(csv, 'tables/motion.csv in the package').toBeDefined()
    const lines = csv!.split('\r\n').filter(Boolean)
    expect(lines[0]).toMatch(/^crank angle[^,]*\(°\),slider position \(mm\),slider velocity \(m\/s\),marker$/)
    const rows = lines.slice(1).map((l) => l.split(','))
    expect(rows.length).toBeGreaterThanOrEqual(12)
    const [a, b, e] = [40, 160, 10]
    // The angle column is the crank angle from +x, counter-clockwise (the default convention).
    for (const [angle, position, velocity] of rows) {
      expect(velocity).toMatch(/^-?\d+\.\d+$/)
      const theta = (Number(angle) * Math.PI) / 180
      const x = a * Math.cos(theta) + Math.sqrt(b * b - (a * Math.sin(theta) - e) ** 2)
      // Half a unit in the printed last digit, plus what the printed angle's rounding moves x.
      expect(Math.abs(Number(position) - x), `at ${angle}°`).toBeLessThan(0.01)
    }
    // The marked outer dead centre: the slider at its farthest, √((a + b)² − e²), at θ = atan(e / √((a + b)² − e²)).
    const outer = rows.find((r) => r[3] === 'outer dead centre')!
    expect(Number(outer[1])).toBeCloseTo(Math.sqrt((a + b) ** 2 - e * e), 2)
    expect(Number(outer[0])).toBeCloseTo((Math.atan2(e, Math.sqrt((a + b) ** 2 - e * e)) * 180) / Math.PI, 2)
  })

  it('should quote fields that need it and write no typographic minus or dash', () => {
    const csv = tableCsv({ of: 'x', angles: '', columns: [{ label: 'a, b', unit: 'mm', decimals: 1 }, { label: 'c "d"', unit: '', decimals: 1 }], rows: [{ cells: ['\u22121.5', '—'], marker: 'outer, dead centre' }] })
    expect(csv).toBe('"a, b (mm)","c ""d""",marker\r\n-1.5,,"outer, dead centre"\r\n')
  })
})
