/**
 * `drawing` blocks: a to-scale kinematic sketch of a linkage block, with the
 * positions asked for, the dead centres ghosted and the stroke, offset or
 * output swing dimensioned. Geometry comes from the core; the render layer
 * draws it.
 *
 *     of: pusher
 *     show: dead centres, least transmission angle, 60 deg
 */
import { displayUnit, formatNumber, showQuantity, unitLabel } from '../display.js'
import { evaluateText } from '../expressions.js'
import { messages } from '../messages.js'
import { fromSI, readQuantity } from '../quantity.js'
import { reportError } from '../report.js'
import type { DisplayUnits } from '../types.js'
import { toCore, toDisplay } from './angles.js'
import { openSweepBlock, sweepDependencies } from './sweep-block.js'
import { outcome, type BlockKind, type Dimension, type DrawnPose, type DrawingOutcome, type Point2 } from './kind.js'

const KNOWN = ['of', 'show', 'animate', 'size']
const FRAMES = 72

export const drawingKind: BlockKind = {
  name: 'drawing',
  label: 'Drawing',
  needsId: false,
  dependencies: sweepDependencies,
  evaluate(block, context) {
    const { file, meta } = context
    const opened = openSweepBlock(block, context, 'drawing-syntax', KNOWN)
    if (!opened) return null
    const { entries, of, linkage, source, fail } = opened
    const { geometry } = source
    const result = (name: string): number | null => {
      const v = linkage.results.find((r) => r.name === name)?.value
      return v?.type === 'quantity' ? v.si : null
    }
    const worst = source.extremes.get('transmission_angle')
    const worstTheta =
      geometry.kind === 'four-bar' && worst
        ? (Math.PI - worst.max.value < worst.min.value ? worst.max.theta : worst.min.theta)
        : (worst?.min.theta ?? null)
    // Positions asked for: dead centres (ghosted), named positions and angles (drawn solid).
    const show = (entries.get('show')?.value ?? 'dead centres, least transmission angle').split(',').map((s) => s.trim()).filter(Boolean)
    const poses: DrawnPose[] = []
    const angleText = (theta: number) => showQuantity(toDisplay(source, theta), 'angle', meta.units, meta.digits)
    const add = (label: string, theta: number, ghost: boolean): boolean => {
      const points = geometry.pose(theta)
      if (!points) return false
      poses.push({ label, theta, ghost, points })
      return true
    }
    for (const item of show) {
      if (item === 'dead centres' || item === 'toggles') {
        for (const marker of source.markers) add(marker.label, marker.theta, true)
      } else if (item === 'least transmission angle') {
        if (worstTheta !== null) add(`least transmission angle, θ = ${angleText(worstTheta)}`, worstTheta, false)
      } else {
        const evaluated = evaluateText(item, context.scope, {}, context.blockIds)
        const reading = evaluated.ok ? readQuantity(evaluated.value, 'angle') : null
        if (!reading?.ok) return fail(`\`show\` takes \`dead centres\`, \`least transmission angle\` or crank angles such as \`60 deg\` (${source.convention.label}); \`${item}\` is none of these`, entries.get('show')!.valuePlace)
        const theta = toCore(source, reading.si)
        if (!add(`θ = ${angleText(theta)}`, theta, false)) return fail(`the linkage cannot assemble at ${item}`, entries.get('show')!.valuePlace)
      }
    }
    if (!poses.some((p) => !p.ghost)) add(`θ = ${angleText(source.start)}`, source.start, false)
    poses.sort((p, q) => Number(q.ghost) - Number(p.ghost))

    const dimensions: Dimension[] = []
    const text = (symbol: string, si: number, kind: 'length' | 'angle') => `${symbol} = ${showQuantity(si, kind, meta.units, meta.digits)}`
    let swing: DrawingOutcome['swing'] = null
    let couplerPath: Float64Array | null = null
    if (geometry.kind === 'slider-crank') {
      const outer = source.markers.find((m) => m.name === 'outer')
      const inner = source.markers.find((m) => m.name === 'inner')
      const stroke = result('stroke')
      if (outer && inner && stroke !== null) {
        const b1 = geometry.pose(outer.theta)!.B!
        const b2 = geometry.pose(inner.theta)!.B!
        const arc = geometry.path?.type === 'arc'
        dimensions.push({ from: b2, to: b1, side: -1, si: stroke, text: `${text('S', stroke, 'length')}${arc ? ' along the arc' : ''}`, role: 'stroke' })
      }
      const offset = linkage.inputs.find((i) => i.name === 'offset')?.value
      const h = offset?.type === 'quantity' ? offset.si : 0
      if (geometry.path?.type === 'line' && Math.abs(h) > 0) {
        // From the crank axis up (or down) to the path's centre line, dimensioned to the left.
        dimensions.push({ from: [0, 0], to: [0, h], side: h > 0 ? 1 : -1, si: Math.abs(h), text: text('e', Math.abs(h), 'length'), role: 'offset' })
      }
    } else {
      const toggles = source.markers.filter((m) => m.name === 'extended' || m.name === 'folded')
      const o4 = geometry.pivots[1]!
      const swingValue = result('output_swing')
      if (toggles.length === 2 && swingValue !== null) {
        const angles = toggles.map((t) => {
          const b = geometry.pose(t.theta)!.B!
          return Math.atan2(b[1] - o4[1], b[0] - o4[0])
        })
        swing = { centre: o4, from: angles[0]!, to: angles[1]!, text: `ψ = ${showQuantity(swingValue, 'angle', meta.units, meta.digits)}` }
      }
      const ground = linkage.inputs.find((i) => i.name === 'ground')?.value
      if (ground?.type === 'quantity') {
        dimensions.push({ from: [0, 0], to: o4, side: -1, si: ground.si, text: text('d', ground.si, 'length'), role: 'ground' })
      }
      if (source.quantities.some((q) => q.name === 'coupler_point_x')) {
        const n = 361 * source.periodTurns
        const angles = new Float64Array(n)
        for (let i = 0; i < n; i++) angles[i] = source.start + ((source.end - source.start) * i) / (n - 1)
        const columns = source.at(angles)
        couplerPath = new Float64Array(2 * n)
        for (let i = 0; i < n; i++) {
          couplerPath[2 * i] = columns.coupler_point_x![i]!
          couplerPath[2 * i + 1] = columns.coupler_point_y![i]!
        }
      }
    }

    const animate = entries.get('animate')?.value ?? 'yes'
    if (animate !== 'yes' && animate !== 'no') {
      reportError(file, 'invalid-choice', messages['invalid-choice']('animate', animate, ['yes', 'no']), entries.get('animate')!.valuePlace)
      return null
    }
    let frames: Readonly<Record<string, Point2>>[] | null = null
    if (animate === 'yes') {
      frames = []
      const count = source.fullTurn ? FRAMES * source.periodTurns : FRAMES + 1
      // A crank that only rocks goes there and back.
      for (let i = 0; i < count; i++) {
        const f = i / (FRAMES * (source.fullTurn ? source.periodTurns : 1))
        const theta = geometry.rotation === 1 || !source.fullTurn ? source.start + f * (source.end - source.start) : source.end - f * (source.end - source.start)
        const pose = geometry.pose(theta)
        if (pose) frames.push(pose)
      }
      if (!source.fullTurn) frames.push(...[...frames].reverse().slice(1))
    }
    const speed = linkage.inputs.find((i) => i.name === 'speed')?.value
    const cycle = result('cycle_time') ?? (speed?.type === 'quantity' && speed.si > 0 ? (2 * Math.PI) / speed.si : null)
    const period = cycle !== null && Number.isFinite(cycle) ? Math.min(8, Math.max(1.5, cycle)) : 4
    const size = /^(\d+)\s*[x×]\s*(\d+)$/.exec((entries.get('size')?.value ?? '640 x 320').trim())
    if (!size) return fail('expected `size:` as width x height in pixels, e.g. `640 x 320`', entries.get('size')?.valuePlace)
    const extent = Math.max(...poses.flatMap((p) => Object.values(p.points).map(([x, y]) => Math.hypot(x, y))), geometry.crank)
    const drawing: DrawingOutcome = {
      of: of.value,
      title: block.title,
      geometry,
      poses,
      dimensions,
      swing,
      couplerPath,
      frames,
      period,
      scaleBar: scaleBar(extent * 0.35, meta.units),
      width: Number(size[1]),
      height: Number(size[2]),
      angles: { reference: source.convention.origin, sense: source.convention.sense, words: source.convention.words, fromDeadCentre: source.convention.reference === 'outer-dead-centre' },
      description: describe(of.value, geometry.kind, poses, dimensions, swing),
    }
    return outcome(block, 'Drawing', { drawing })
  },
}

/** A round scale-bar length near `target` metres: 1, 2 or 5 × 10ⁿ of the display unit. */
function scaleBar(target: number, units: DisplayUnits): { length: number; text: string } {
  const unit = displayUnit('length', units)
  const inUnit = fromSI(target, 'length', unit)
  const power = 10 ** Math.floor(Math.log10(inUnit))
  const nice = [1, 2, 5, 10].map((m) => m * power).filter((v) => v <= inUnit).pop() ?? power
  return { length: (target * nice) / inUnit, text: `${formatNumber(nice, 3).replace(/\.?0+$/, '')} ${unitLabel(unit)}` }
}

function describe(of: string, kind: string, poses: readonly DrawnPose[], dimensions: readonly Dimension[], swing: DrawingOutcome['swing']): string {
  const solid = poses.filter((p) => !p.ghost).map((p) => p.label)
  const ghosts = poses.filter((p) => p.ghost).map((p) => p.label)
  return [
    `To-scale sketch of #${of} (${kind})`,
    solid.length ? `drawn at ${solid.join('; ')}` : '',
    ghosts.length ? `ghosted at the ${ghosts.join(' and ')}` : '',
    dimensions.length ? `dimensioned: ${dimensions.map((d) => d.text).join(', ')}` : '',
    swing ? `output swing ${swing.text}` : '',
  ]
    .filter(Boolean)
    .join('; ')
}
