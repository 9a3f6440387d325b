/**
 * To-scale kinematic sketch of a linkage as SVG, drawn by our own code:
 * ground pivots, links as bars with pin joints, the slider and its guide,
 * dead centres ghosted, stroke/offset/swing dimensioned as a draughtsman
 * dimensions (extension lines, arrows, value with unit), the crank-angle
 * convention and a scale bar. Coordinates are printed to 0.01 px.
 */
import type { DrawingOutcome, Point2 } from '../notes/block-kinds/kind.js'

const INK = '#1c2226'
const CRANK = '#0b5563'
const OUTPUT = '#5b3f8c'
const GHOST = '#9aa5ad'
const CENTRE_LINE = '#7a8790'
const FILL = '#dfe6ea'
const FONT = 'DejaVu Sans, Liberation Sans, Arial, sans-serif'
const MARGIN = 46

const f = (v: number): string => (Math.round(v * 100) / 100).toFixed(2).replace(/\.?0+$/, '') || '0'
const esc = (text: string): string => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')

/** World (m) to page (px): uniform scale, y up. */
interface Frame {
  readonly scale: number
  readonly ox: number
  readonly oy: number
  readonly width: number
  readonly height: number
}

function px(frame: Frame, [x, y]: Point2): [number, number] {
  return [frame.ox + frame.scale * x, frame.oy - frame.scale * y]
}

/** The static sketch. */
export function drawingSvg(drawing: DrawingOutcome, id: string): string {
  const frame = fitFrame(drawing)
  const parts: string[] = []
  const g = drawing.geometry
  const P = (p: Point2) => px(frame, p)
  const sliderLength = Math.max(18, 0.34 * g.crank * frame.scale)
  const sliderHeight = sliderLength * 0.5
  parts.push(`<title id="${id}-title">${esc(drawing.title ?? `Sketch of #${drawing.of}`)}</title>`, `<desc id="${id}-desc">${esc(drawing.description)}</desc>`)

  // 1. Centre lines and guides.
  const bs = drawing.poses.map((p) => p.points.B).filter((b): b is Point2 => b !== undefined)
  if (g.kind === 'slider-crank' && g.path?.type === 'line') {
    const xs = bs.map((b) => P(b)[0])
    const [x0, x1] = [Math.min(...xs) - sliderLength, Math.max(...xs) + sliderLength]
    const y = P([0, g.path.y])[1]
    // The centre line runs back over the crank axis, where the offset is dimensioned from.
    parts.push(line(Math.min(x0, P([0, 0])[0]) - 10, y, x1 + 10, y, CENTRE_LINE, 0.8, '9 3 2 3', 'lw-centre-line'))
    for (const side of [-1, 1]) parts.push(line(x0, y + side * (sliderHeight / 2 + 1.5), x1, y + side * (sliderHeight / 2 + 1.5), INK, 1.4, null, 'lw-guide'))
  } else if (g.kind === 'slider-crank' && g.path?.type === 'arc') {
    const c = P([g.path.cx, g.path.cy])
    const angles = bs.map((b) => Math.atan2(-(P(b)[1] - c[1]), P(b)[0] - c[0]))
    const spread = sliderLength / (g.path.radius * frame.scale)
    const [a0, a1] = [Math.min(...angles) - spread, Math.max(...angles) + spread]
    const r = g.path.radius * frame.scale
    parts.push(arc(c, r, a0 - 0.02, a1 + 0.02, CENTRE_LINE, 0.8, '9 3 2 3', 'lw-centre-line'))
    for (const side of [-1, 1]) parts.push(arc(c, r + side * (sliderHeight / 2 + 1.5), a0, a1, INK, 1.4, null, 'lw-guide'))
  } else if (g.kind === 'four-bar') {
    const [a, b] = [P(g.pivots[0]!), P(g.pivots[1]!)]
    parts.push(line(a[0], a[1], b[0], b[1], CENTRE_LINE, 0.8, '9 3 2 3', 'lw-centre-line'))
  }
  // Crank axis centre mark.
  const o = P([0, 0])
  parts.push(line(o[0] - 14, o[1], o[0] + 14, o[1], CENTRE_LINE, 0.7, '6 2 2 2', 'lw-centre-line'), line(o[0], o[1] - 14, o[0], o[1] + 14, CENTRE_LINE, 0.7, '6 2 2 2', 'lw-centre-line'))

  // 2. Coupler-point path.
  if (drawing.couplerPath) {
    const points: string[] = []
    for (let i = 0; i < drawing.couplerPath.length; i += 2) {
      const [x, y] = P([drawing.couplerPath[i]!, drawing.couplerPath[i + 1]!])
      points.push(`${f(x)},${f(y)}`)
    }
    parts.push(`<polyline class="lw-coupler-path" points="${points.join(' ')}" fill="none" stroke="${CRANK}" stroke-width="1" stroke-dasharray="4 2"/>`)
  }

  // 3. Poses: ghosts first, then the solid ones on top.
  for (const pose of drawing.poses) parts.push(poseSvg(frame, g.kind, pose.points, pose.ghost, sliderLength, sliderHeight, g.path, pose.label))

  // 4. Ground symbols at the fixed pivots.
  for (const pivot of g.pivots) parts.push(groundSymbol(P(pivot)))

  // 5. Dimensions and the output swing.
  for (const d of drawing.dimensions) {
    const offset = d.role === 'stroke' ? sliderHeight / 2 + 22 : d.role === 'offset' ? Math.max(34, 1.25 * g.crank * frame.scale) : 26
    parts.push(dimensionSvg(frame, d, offset))
  }
  if (drawing.swing) {
    const c = P(drawing.swing.centre)
    const b = drawing.poses[0]!.points.B ?? drawing.swing.centre
    const r = 0.45 * Math.hypot(b[0] - drawing.swing.centre[0], b[1] - drawing.swing.centre[1]) * frame.scale
    const [a0, a1] = [drawing.swing.from, drawing.swing.to]
    parts.push(`<g class="lw-dim lw-dim-swing" data-si="${f(Math.abs(a1 - a0))}">${arc(c, r, Math.min(a0, a1), Math.max(a0, a1), INK, 0.8, null, 'lw-dim-line')}`)
    for (const a of [a0, a1]) {
      const tip: [number, number] = [c[0] + r * Math.cos(a), c[1] - r * Math.sin(a)]
      const sign = a === Math.max(a0, a1) ? 1 : -1
      parts.push(arrow(tip, Math.atan2(-Math.cos(a) * sign, -Math.sin(a) * sign)))
    }
    const mid = (a0 + a1) / 2
    parts.push(text(c[0] + (r + 12) * Math.cos(mid), c[1] - (r + 12) * Math.sin(mid), drawing.swing.text, 'middle', 'lw-dim-text'), '</g>')
  }

  // 6. Crank-angle convention at the crank axis: θ from its reference line (+x, or the crank at
  //    outer dead centre) in the sense the block measures it; the rotation's own arrow apart.
  const solid = drawing.poses.find((p) => !p.ghost)
  if (solid?.points.A) {
    const r = Math.max(16, 0.42 * g.crank * frame.scale)
    const theta = Math.atan2(solid.points.A[1], solid.points.A[0])
    const { reference, sense } = drawing.angles
    const turn = 2 * Math.PI
    const measured = (((sense * (theta - reference)) % turn) + turn) % turn
    const start = reference
    const end = reference + sense * measured
    parts.push(line(o[0], o[1], o[0] + r * 1.35 * Math.cos(reference), o[1] - r * 1.35 * Math.sin(reference), INK, 0.7, '3 2', 'lw-angle-reference'))
    parts.push(arc(o, r, Math.min(start, end), Math.max(start, end), INK, 0.8, null, 'lw-angle-arc'))
    const tip: [number, number] = [o[0] + r * Math.cos(end), o[1] - r * Math.sin(end)]
    parts.push(arrow(tip, sense === 1 ? Math.atan2(-Math.cos(end), -Math.sin(end)) : Math.atan2(Math.cos(end), Math.sin(end))))
    // A small angle leaves no room inside the arc: the label then goes just outside the reference line.
    const mid = measured < 0.6 ? reference - 0.5 * sense : (start + end) / 2
    parts.push(text(o[0] + (r + 12) * Math.cos(mid), o[1] - (r + 12) * Math.sin(mid) + 4, drawing.angles.fromDeadCentre ? 'θ from ODC' : 'θ', 'middle', 'lw-angle-label'))
    // The sense of rotation: a short arrowed arc on the far side of the crank pin's circle.
    const rr = g.crank * frame.scale + 10
    const a0 = theta + Math.PI - 0.35
    const a1 = theta + Math.PI + 0.35
    parts.push(arc(o, rr, a0, a1, CRANK, 1, null, 'lw-rotation'))
    const head = g.rotation === 1 ? a1 : a0
    const headTip: [number, number] = [o[0] + rr * Math.cos(head), o[1] - rr * Math.sin(head)]
    parts.push(arrow(headTip, g.rotation === 1 ? Math.atan2(-Math.cos(head), -Math.sin(head)) : Math.atan2(Math.cos(head), Math.sin(head))))
    const labelAt = theta + Math.PI
    parts.push(text(o[0] + (rr + 12) * Math.cos(labelAt), o[1] - (rr + 12) * Math.sin(labelAt) + 4, `ω ${g.rotation === 1 ? 'ccw' : 'cw'}`, 'middle', 'lw-rotation-label', CRANK))
  }

  // 7. Scale bar.
  const bar = drawing.scaleBar.length * frame.scale
  const by = frame.height - 14
  parts.push(
    `<g class="lw-scale-bar" data-length="${f(drawing.scaleBar.length * 1000)}">`,
    line(10, by, 10 + bar, by, INK, 1.6, null, null),
    line(10, by - 4, 10, by + 4, INK, 1, null, null),
    line(10 + bar, by - 4, 10 + bar, by + 4, INK, 1, null, null),
    text(10 + bar + 6, by + 4, drawing.scaleBar.text, 'start', null),
    '</g>',
  )
  return svgRoot(frame, id, parts.join(''))
}

/** The animation over one cycle (screen only): the solid links moving through the frames. */
export function animationSvg(drawing: DrawingOutcome, id: string): string | null {
  if (!drawing.frames || drawing.frames.length < 2) return null
  const frame = fitFrame(drawing)
  const g = drawing.geometry
  const P = (p: Point2) => px(frame, p)
  const sliderLength = Math.max(18, 0.34 * g.crank * frame.scale)
  const sliderHeight = sliderLength * 0.5
  const frames = [...drawing.frames, drawing.frames[0]!]
  const values = (joint: string, axis: 0 | 1) => frames.map((p) => f(P(p[joint] ?? [0, 0])[axis])).join(';')
  const dur = `${f(drawing.period)}s`
  const anim = (attr: string, v: string) => `<animate attributeName="${attr}" values="${v}" dur="${dur}" repeatCount="indefinite" calcMode="linear"/>`
  const bar = (from: string, to: string, color: string, cls: string) => {
    const first = drawing.frames![0]!
    const [x1, y1] = P(first[from] ?? [0, 0])
    const [x2, y2] = P(first[to] ?? [0, 0])
    return `<line class="${cls}" x1="${f(x1)}" y1="${f(y1)}" x2="${f(x2)}" y2="${f(y2)}" stroke="${color}" stroke-width="5" stroke-linecap="round">${anim('x1', values(from, 0))}${anim('y1', values(from, 1))}${anim('x2', values(to, 0))}${anim('y2', values(to, 1))}</line>`
  }
  const pin = (joint: string) => {
    const [x, y] = P(drawing.frames![0]![joint] ?? [0, 0])
    return `<circle cx="${f(x)}" cy="${f(y)}" r="3.6" fill="#fff" stroke="${INK}" stroke-width="1.4">${anim('cx', values(joint, 0))}${anim('cy', values(joint, 1))}</circle>`
  }
  const parts: string[] = [`<title id="${id}-title">Animation of #${esc(drawing.of)} over one cycle</title>`]
  for (const pivot of g.pivots) parts.push(groundSymbol(P(pivot)))
  if (g.kind === 'slider-crank') {
    const [x, y] = P(drawing.frames[0]!.B!)
    parts.push(
      `<rect x="${f(x - sliderLength / 2)}" y="${f(y - sliderHeight / 2)}" width="${f(sliderLength)}" height="${f(sliderHeight)}" fill="${FILL}" stroke="${INK}" stroke-width="1.2">${anim('x', frames.map((p) => f(P(p.B!)[0] - sliderLength / 2)).join(';'))}${anim('y', frames.map((p) => f(P(p.B!)[1] - sliderHeight / 2)).join(';'))}</rect>`,
    )
    parts.push(bar('O', 'A', CRANK, 'lw-link'), bar('A', 'B', INK, 'lw-link'), pin('A'), pin('B'))
  } else {
    parts.push(bar('O', 'A', CRANK, 'lw-link'), bar('A', 'B', INK, 'lw-link'), bar('O4', 'B', OUTPUT, 'lw-link'), pin('A'), pin('B'))
    if (drawing.frames[0]!.P) parts.push(bar('A', 'P', INK, 'lw-link'), pin('P'))
  }
  return svgRoot(frame, id, parts.join(''), 'lw-animation-svg')
}

function svgRoot(frame: Frame, id: string, content: string, cls = 'lw-drawing-svg'): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="${cls}" role="img" aria-labelledby="${id}-title ${id}-desc" ` +
    `width="${f(frame.width)}" height="${f(frame.height)}" viewBox="0 0 ${f(frame.width)} ${f(frame.height)}" ` +
    `data-scale="${frame.scale.toPrecision(12)}" data-origin-x="${f(frame.ox)}" data-origin-y="${f(frame.oy)}" ` +
    `font-family="${FONT}" font-size="10.5">${content}</svg>`
  )
}

/** Fit every point of the drawing into its box with a uniform scale. */
function fitFrame(drawing: DrawingOutcome): Frame {
  const points: Point2[] = [...drawing.geometry.pivots]
  for (const pose of drawing.poses) points.push(...Object.values(pose.points))
  for (const frame of drawing.frames ?? []) points.push(...Object.values(frame))
  for (const d of drawing.dimensions) points.push(d.from, d.to)
  if (drawing.couplerPath) for (let i = 0; i < drawing.couplerPath.length; i += 2) points.push([drawing.couplerPath[i]!, drawing.couplerPath[i + 1]!])
  const xs = points.map((p) => p[0])
  const ys = points.map((p) => p[1])
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)]
  const spanX = Math.max(x1 - x0, 1e-9)
  const spanY = Math.max(y1 - y0, 1e-9)
  const scale = Math.min((drawing.width - 2 * MARGIN) / spanX, (drawing.height - 2 * MARGIN) / spanY)
  const width = drawing.width
  const height = Math.min(drawing.height, Math.ceil(spanY * scale + 2 * MARGIN + 10))
  return { scale, ox: (width - spanX * scale) / 2 - x0 * scale, oy: MARGIN + y1 * scale, width, height }
}

function poseSvg(
  frame: Frame,
  kind: 'slider-crank' | 'four-bar',
  points: Readonly<Record<string, Point2>>,
  ghost: boolean,
  sliderLength: number,
  sliderHeight: number,
  path: DrawingOutcome['geometry']['path'],
  label: string,
): string {
  const P = (p: Point2 | undefined) => px(frame, p ?? [0, 0])
  const width = ghost ? 1.2 : 5
  const dash = ghost ? '5 3' : null
  const color = (c: string) => (ghost ? GHOST : c)
  const out: string[] = [`<g class="${ghost ? 'lw-pose lw-ghost' : 'lw-pose'}" data-label="${esc(label)}">`]
  const bar = (a: string, b: string, c: string) => {
    const [x1, y1] = P(points[a])
    const [x2, y2] = P(points[b])
    out.push(`<line class="lw-link" data-link="${a}${b}" x1="${f(x1)}" y1="${f(y1)}" x2="${f(x2)}" y2="${f(y2)}" stroke="${color(c)}" stroke-width="${width}" stroke-linecap="round"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`)
  }
  if (kind === 'slider-crank') {
    const [bx, by] = P(points.B)
    // The slider lies along the path's tangent at B.
    let angle = 0
    if (path?.type === 'arc') {
      const [cx, cy] = px(frame, [path.cx, path.cy])
      angle = (Math.atan2(by - cy, bx - cx) * 180) / Math.PI + 90
    }
    out.push(
      `<rect class="lw-slider" x="${f(bx - sliderLength / 2)}" y="${f(by - sliderHeight / 2)}" width="${f(sliderLength)}" height="${f(sliderHeight)}" fill="${ghost ? 'none' : FILL}" stroke="${color(INK)}" stroke-width="${ghost ? 1 : 1.2}"${dash ? ` stroke-dasharray="${dash}"` : ''}${angle ? ` transform="rotate(${f(angle)} ${f(bx)} ${f(by)})"` : ''}/>`,
    )
    bar('O', 'A', CRANK)
    bar('A', 'B', INK)
  } else {
    if (points.P) {
      const [ax, ay] = P(points.A)
      const [bx, by] = P(points.B)
      const [qx, qy] = P(points.P)
      out.push(`<polygon class="lw-coupler-plate" points="${f(ax)},${f(ay)} ${f(bx)},${f(by)} ${f(qx)},${f(qy)}" fill="${ghost ? 'none' : FILL}" stroke="${color(INK)}" stroke-width="1"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`)
    }
    bar('O', 'A', CRANK)
    bar('A', 'B', INK)
    bar('O4', 'B', OUTPUT)
  }
  for (const joint of Object.keys(points)) {
    if (joint === 'O' || joint === 'O4') continue
    const [x, y] = P(points[joint])
    out.push(`<circle class="lw-pin" data-joint="${joint}" cx="${f(x)}" cy="${f(y)}" r="${ghost ? 2.2 : 3.6}" fill="#fff" stroke="${color(INK)}" stroke-width="${ghost ? 1 : 1.4}"/>`)
    if (!ghost) {
      // Labels sit away from the crank axis so that they clear the links.
      const [ox, oy] = P([0, 0])
      const d = Math.hypot(x - ox, y - oy) || 1
      out.push(text(x + (12 * (x - ox)) / d, y + (12 * (y - oy)) / d + 4, joint, 'middle', 'lw-joint-label'))
    }
  }
  if (ghost && points.B) {
    const [x, y] = P(points.B)
    // Kept inside the drawing: about 6 px a character at this size.
    const half = label.length * 3
    const cx = Math.min(Math.max(x, half + 4), frame.width - half - 4)
    out.push(text(cx, y - sliderHeight / 2 - 6, label, 'middle', 'lw-ghost-label', GHOST))
  }
  out.push('</g>')
  return out.join('')
}

function groundSymbol([x, y]: [number, number]): string {
  const hatch: string[] = []
  for (let i = -2; i <= 2; i++) hatch.push(line(x + i * 5 - 3, y + 17, x + i * 5 + 3, y + 11, INK, 0.8, null, null))
  return `<g class="lw-ground">${`<path d="M${f(x)},${f(y)} L${f(x - 8)},${f(y + 11)} L${f(x + 8)},${f(y + 11)} Z" fill="${FILL}" stroke="${INK}" stroke-width="1"/>`}${line(x - 13, y + 11, x + 13, y + 11, INK, 1.2, null, null)}${hatch.join('')}<circle class="lw-pivot" cx="${f(x)}" cy="${f(y)}" r="4" fill="#fff" stroke="${INK}" stroke-width="1.4"/></g>`
}

function dimensionSvg(frame: Frame, d: DrawingOutcome['dimensions'][number], offset: number): string {
  const [x1, y1] = px(frame, d.from)
  const [x2, y2] = px(frame, d.to)
  const length = Math.hypot(x2 - x1, y2 - y1) || 1
  // Unit normal on the chosen side (page coordinates: y down, so world "side" flips).
  const nx = (-(y2 - y1) / length) * -d.side
  const ny = ((x2 - x1) / length) * -d.side
  const [ax, ay] = [x1 + nx * offset, y1 + ny * offset]
  const [bx, by] = [x2 + nx * offset, y2 + ny * offset]
  const angle = Math.atan2(by - ay, bx - ax)
  const textAngle = ((angle * 180) / Math.PI + 360) % 360
  const upright = textAngle > 90 && textAngle < 270 ? textAngle - 180 : textAngle
  const [mx, my] = [(ax + bx) / 2 + nx * 8, (ay + by) / 2 + ny * 8]
  return [
    `<g class="lw-dim lw-dim-${d.role}" data-si="${d.si.toPrecision(12)}">`,
    line(x1 + nx * 3, y1 + ny * 3, ax + nx * 5, ay + ny * 5, INK, 0.7, null, 'lw-dim-ext'),
    line(x2 + nx * 3, y2 + ny * 3, bx + nx * 5, by + ny * 5, INK, 0.7, null, 'lw-dim-ext'),
    line(ax, ay, bx, by, INK, 0.8, null, 'lw-dim-line'),
    arrow([ax, ay], angle + Math.PI),
    arrow([bx, by], angle),
    `<text class="lw-dim-text" x="${f(mx)}" y="${f(my)}" text-anchor="middle" dominant-baseline="middle" transform="rotate(${f(upright)} ${f(mx)} ${f(my)})" fill="${INK}" stroke="#fff" stroke-width="3" stroke-linejoin="round" paint-order="stroke">${esc(d.text)}</text>`,
    '</g>',
  ].join('')
}

/** A filled arrowhead with its tip at `tip`, pointing along `angle` (page radians). */
function arrow([x, y]: [number, number], angle: number): string {
  const l = 7
  const w = 2.4
  const [c, s] = [Math.cos(angle), Math.sin(angle)]
  const bx = x - c * l
  const by = y - s * l
  return `<path class="lw-arrow" d="M${f(x)},${f(y)} L${f(bx - s * w)},${f(by + c * w)} L${f(bx + s * w)},${f(by - c * w)} Z" fill="${INK}"/>`
}

function line(x1: number, y1: number, x2: number, y2: number, stroke: string, width: number, dash: string | null, cls: string | null): string {
  return `<line${cls ? ` class="${cls}"` : ''} x1="${f(x1)}" y1="${f(y1)}" x2="${f(x2)}" y2="${f(y2)}" stroke="${stroke}" stroke-width="${width}"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`
}

/** An arc about a page centre, angles in world sense (counter-clockwise, y up). */
function arc(c: [number, number], r: number, a0: number, a1: number, stroke: string, width: number, dash: string | null, cls: string | null): string {
  const p0 = [c[0] + r * Math.cos(a0), c[1] - r * Math.sin(a0)]
  const p1 = [c[0] + r * Math.cos(a1), c[1] - r * Math.sin(a1)]
  const large = a1 - a0 > Math.PI ? 1 : 0
  return `<path${cls ? ` class="${cls}"` : ''} d="M${f(p0[0]!)},${f(p0[1]!)} A${f(r)},${f(r)} 0 ${large} 0 ${f(p1[0]!)},${f(p1[1]!)}" fill="none" stroke="${stroke}" stroke-width="${width}"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`
}

/** Text with a white halo, so that it reads over the lines it crosses. */
function text(x: number, y: number, value: string, anchor: 'start' | 'middle' | 'end', cls: string | null, color = INK): string {
  return `<text${cls ? ` class="${cls}"` : ''} x="${f(x)}" y="${f(y)}" text-anchor="${anchor}" fill="${color}" stroke="#fff" stroke-width="3" stroke-linejoin="round" paint-order="stroke">${esc(value)}</text>`
}
