/**
 * What a block kind is: how it finds the blocks it depends on, and how it
 * evaluates into an outcome the package renders. One file per kind.
 */
import type { VFile } from 'vfile'
import type { Extremes, FourBarAnalysis, SliderCrankAnalysis } from '../../linkage/index.js'
import type { ExtremesRow } from './extremes.js'
import type { Scope } from '../expressions.js'
import type { QuantityKind } from '../quantity.js'
import type { CalcBlock, InputValue, MethodStep, NamedValue, NoteMeta } from '../types.js'

/** Shared state while a note's blocks are evaluated in dependency order. */
export interface EvaluationContext {
  readonly file: VFile
  readonly meta: NoteMeta
  readonly scope: Scope
  /** Every block id of the note. */
  readonly blockIds: ReadonlySet<string>
  /** Outcomes of the blocks evaluated so far, by id. */
  readonly outcomes: Map<string, BlockOutcome>
  /** Reference keys cited, with where (ordered into document order later). */
  readonly citations: Citation[]
  /** Reads a data file the note names (a load table), or null when the caller gives no files. */
  readonly readData: DataReader | null
  /** Data files read, with their digests, for the package and its fingerprint. */
  readonly dataFiles: DataFile[]
  /** Work the note has spent so far (shared with a study's scratch evaluations), against its bounds. */
  readonly budget: { samples: number }
}

/** Most Monte Carlo samples one note may draw in all, studies included: about seven seconds on one core with their statistics. */
export const MAX_NOTE_SAMPLES = 5_000_000

/** A data file a note read, identified by its digest. */
export interface DataFile {
  /** Path as written in the note (relative to the note). */
  readonly path: string
  /** sha-256 of its bytes, hex. */
  readonly sha256: string
}

/** What reading a data file gave: its text, or why not (outside the design repository, missing). */
export type DataRead = { readonly ok: true; readonly text: string; readonly sha256: string } | { readonly ok: false; readonly reason: string }

/** Reads a file named by a note, relative to the note; refuses paths that leave the design repository. */
export type DataReader = (path: string) => DataRead

/** A reference key cited at a place in the note. */
export interface Citation {
  readonly key: string
  readonly line: number
  readonly column: number
}

/** A quantity a linkage can sweep over its crank (input) angle. */
export interface SweptQuantity {
  readonly name: string
  readonly label: string
  readonly kind: QuantityKind
}

/** A marked angle: a dead centre, a toggle, a limit. */
export interface AngleMarker {
  readonly name: string
  readonly label: string
  /** A few letters for a chart's top edge (ODC, IDC …), explained in its caption. */
  readonly short: string
  /** rad in [0, 2π) */
  readonly theta: number
}

/** A point in the linkage's frame, m. */
export type Point2 = readonly [number, number]

/** Where the joints are, for drawings. */
export interface LinkageGeometry {
  readonly kind: 'slider-crank' | 'four-bar'
  /** Joint positions at an input angle (O, A, B; four-bar also O4 and P), or null where it cannot assemble. */
  pose(theta: number): Readonly<Record<string, Point2>> | null
  /** Fixed pivots: the crank axis O, and O4 for a four-bar. */
  readonly pivots: readonly Point2[]
  /** Slider path of a slider-crank. */
  readonly path: { readonly type: 'line'; readonly y: number } | { readonly type: 'arc'; readonly cx: number; readonly cy: number; readonly radius: number } | null
  readonly rotation: 1 | -1
  /** Crank (input) radius, m. */
  readonly crank: number
}

/**
 * How a block shows crank (input) angles, the same in its results, tables, charts
 * and drawing: display angle = sense × (θ − origin), θ being the core's angle
 * counter-clockwise from +x.
 */
export interface AngleConvention {
  /** Column and axis words, e.g. "crank angle" or "crank angle from outer dead centre". */
  readonly label: string
  /** How it is measured, for captions and the method, e.g. "counter-clockwise from +x". */
  readonly words: string
  /** Core angle of the zero, rad. */
  readonly origin: number
  /** +1: the display angle grows counter-clockwise; −1: clockwise. */
  readonly sense: 1 | -1
  /** The reference the drawing marks: the +x axis, or the crank at outer dead centre. */
  readonly reference: 'x-axis' | 'outer-dead-centre' | 'ground-line'
}

/** Swept values of a linkage block, for tables and charts (columns in SI). */
export interface SweepSource {
  /** Start and end of the core's crank-angle range, rad. */
  readonly start: number
  readonly end: number
  readonly fullTurn: boolean
  /** Input turns before the motion repeats (2 for a deltoid that needs two turns). */
  readonly periodTurns: 1 | 2
  readonly convention: AngleConvention
  /** The range in display angles, ascending, rad. */
  readonly displayStart: number
  readonly displayEnd: number
  /** Sense of rotation (+1 counter-clockwise). */
  readonly rotation: 1 | -1
  /** Crank (input) speed magnitude, rad/s. */
  readonly speed: number
  readonly quantities: readonly SweptQuantity[]
  readonly markers: readonly AngleMarker[]
  /** Values at the given core angles, one Float64Array per quantity name (time wrapped into one cycle from the time origin). */
  at(angles: Float64Array): Record<string, Float64Array>
  /** Where time starts: the core angle the crank passes at t = 0. */
  readonly timeOrigin: number
  readonly geometry: LinkageGeometry
  /** Exact extremes of each swept quantity (core angles, SI values), by quantity name. */
  readonly extremes: ReadonlyMap<string, Extremes>
  /** Quantities that grow without bound at the range's ends (a crank that rocks), by name. */
  readonly unboundedAtEnds: ReadonlySet<string>
}

/** A check's outcome. */
export interface CheckOutcome {
  readonly label: string
  /** The condition as written (without the informative mark). */
  readonly condition: string
  /** PASS, FAIL, or not evaluated (an error in it or in what it uses). */
  readonly status: 'pass' | 'fail' | 'not-evaluated'
  /** Shown and counted apart; never fails the gate. */
  readonly informative: boolean
  /** Why it was not evaluated, or null. */
  readonly reason: string | null
  readonly actual: string
  readonly limit: string
  /** How far inside (+) or outside (−) the limit, displayed. */
  readonly margin: string
  readonly source: string | null
  readonly line: number
  /** The compared quantities in SI, for results.json (null when not evaluated). */
  readonly actualSI: number | null
  readonly limitSI: number | null
  /** Quantity kind of the compared values, or the SI unit of another dimension. */
  readonly unit: string
  /** The comparison, e.g. '>=', '±' or 'is' (a yes/no result). */
  readonly operator: string
  readonly blockId: string | null
}

/** A table's outcome: header and rows already in display form. */
export interface TableOutcome {
  readonly of: string
  /** How the angle column is measured, in words. */
  readonly angles: string
  /** Each column with its unit and the one count of decimals it is printed with. */
  readonly columns: readonly { readonly label: string; readonly unit: string; readonly decimals: number }[]
  readonly rows: readonly { readonly cells: readonly string[]; readonly marker: string | null }[]
}

/** One series of a chart, in display units. */
export interface ChartSeries {
  readonly name: string
  readonly label: string
  readonly kind: QuantityKind
  /** Unit label as printed, e.g. "m/s²". */
  readonly unit: string
  readonly values: Float64Array
}

/** A chart's content: the core's sweep in display units, with its marks. */
export interface ChartOutcome {
  readonly of: string
  readonly title: string | null
  readonly x: { readonly name: string; readonly label: string; readonly unit: string; readonly kind: QuantityKind; readonly values: Float64Array }
  readonly series: readonly ChartSeries[]
  readonly layout: 'stacked' | 'overlaid'
  /** Dead centres, toggles and limits along the x axis. */
  readonly markers: readonly { readonly label: string; readonly short: string; readonly x: number }[]
  /** A limit line on one series (both signs when symmetric), and which side of it passes. */
  readonly limit: {
    readonly sense: 'at least' | 'at most'
    readonly value: number
    readonly symmetric: boolean
    readonly series: string
    readonly source: string | null
  } | null
  /**
   * The analysis's exact extremes on each series (display units): the point, which
   * way its label goes (above a greatest value, below a least one) and its text.
   */
  readonly peaks: readonly { readonly series: string; readonly x: number; readonly y: number; readonly side: 'above' | 'below'; readonly text: string }[]
  /** Series that grow without bound at the range's ends: their axis is cut to the interior. */
  readonly unbounded: readonly string[]
  /** Each series' mean over the cycle, drawn as a line (display units), when asked for. */
  readonly means: readonly { readonly series: string; readonly value: number; readonly text: string }[]
  /** How the x axis's crank angle is measured, when x is an angle; for the caption. */
  readonly angles: string | null
  readonly width: number
  readonly height: number
  readonly xRange: readonly [number, number] | null
  readonly yRange: readonly [number, number] | null
  /** Same scale on both axes (a path drawn to scale). */
  readonly equalAspect: boolean
  readonly samples: number
  /** What the points are, for a chart of a design block's own numbers (not a linkage's sweep). */
  readonly source?: string
}

/** A pose to draw: the joints at one input angle. */
export interface DrawnPose {
  readonly label: string
  readonly theta: number
  /** Ghosted (dead centres, toggles) or solid (the pose the drawing is about). */
  readonly ghost: boolean
  readonly points: Readonly<Record<string, Point2>>
}

/** A linear dimension between two points, drawn offset from them. */
export interface Dimension {
  readonly from: Point2
  readonly to: Point2
  /** Which way, perpendicular to from→to, the dimension line sits. */
  readonly side: 1 | -1
  /** Value in SI, and the text printed ("S = 80.01 mm"). */
  readonly si: number
  readonly text: string
  readonly role: string
}

/** A to-scale kinematic sketch of a linkage block, in SI coordinates. */
export interface DrawingOutcome {
  readonly of: string
  readonly title: string | null
  readonly geometry: LinkageGeometry
  readonly poses: readonly DrawnPose[]
  readonly dimensions: readonly Dimension[]
  /** Output swing of a four-bar: centre, radius, start and end angles, text. */
  readonly swing: { readonly centre: Point2; readonly from: number; readonly to: number; readonly text: string } | null
  /** Coupler-point path of a four-bar (x, y pairs), or null. */
  readonly couplerPath: Float64Array | null
  /** Poses over one cycle for the animation (screen only), or null. */
  readonly frames: readonly Readonly<Record<string, Point2>>[] | null
  /** Seconds per animation cycle. */
  readonly period: number
  /** Scale-bar length, m, and its text. */
  readonly scaleBar: { readonly length: number; readonly text: string }
  readonly width: number
  readonly height: number
  /** How its crank angle is measured: from the reference direction (core angle, rad) in a sense. */
  readonly angles: { readonly reference: number; readonly sense: 1 | -1; readonly words: string; readonly fromDeadCentre: boolean }
  /** Words describing the drawing, for its text alternative. */
  readonly description: string
}

/** An assumption with its origin. */
export interface Assumption {
  readonly text: string
  /** True when it must still be verified as the design proceeds. */
  readonly verify: boolean
  /** Block id or kind it came from, or null for the note's own. */
  readonly from: string | null
  /** Left out of the package when a block covers this topic (the kinematics-only line where forces are found). */
  readonly droppedWith?: Topic
}

/** A table of data a block read (a load table), printed with its inputs. */
export interface DataTable {
  readonly caption: string
  readonly columns: readonly { readonly label: string; readonly unit: string }[]
  /** Cells as printed, one count of decimals per column. */
  readonly rows: readonly (readonly string[])[]
  readonly source: string | null
}

/** The core analysis behind a block, for the blocks that build on it (forces on a linkage, a flywheel on forces). */
export type CoreHandle =
  | { readonly type: 'slider-crank'; readonly analysis: SliderCrankAnalysis }
  | { readonly type: 'four-bar'; readonly analysis: FourBarAnalysis }
  | { readonly type: 'forces'; readonly cycle: ForceCycle }

/** What a forces block gives the flywheel, column and pin-bearing blocks (SI). */
export interface ForceCycle {
  /** The linkage block the forces are on. */
  readonly linkageId: string
  readonly linkageKind: 'slider-crank' | 'four-bar'
  /** Torque the drive applies to the crank (input), positive in the sense of rotation, at a core angle. */
  torque(theta: number): number
  /** Crank range: start and span (a full turn, or two for a deltoid), and whether it turns fully. */
  readonly start: number
  readonly period: number
  readonly fullTurn: boolean
  /** Crank speed magnitude, rad/s, and sense of rotation. */
  readonly speed: number
  readonly rotation: 1 | -1
  readonly driver: 'crank' | 'slider' | 'input' | 'output'
  /** Mean drive torque over the period, N·m, or null. */
  readonly torqueMean: number | null
  /** Work done on the process load per cycle (J, ≥ 0 when the machine works on it), or null. */
  readonly loadWork: number | null
  /** Largest rod (coupler) compression, N, with its core angle; null when it is never compressed. */
  readonly rodCompression: { readonly value: number; readonly theta: number } | null
  /** Rod (coupler) pin-centre length, m. */
  readonly rodLength: number
  /** Pin forces over the cycle, for bearing checks: force magnitude and the relative angular velocity of the two links it joins, at a core angle. */
  pin(name: 'crank-pin' | 'wrist-pin', theta: number): { readonly force: number; readonly relativeSpeed: number }
  /** Largest force on each pin and its core angle. */
  readonly pinForceMax: Readonly<Record<'crank-pin' | 'wrist-pin', { readonly value: number; readonly theta: number }>>
}

/** What a package can cover; the scope statement lists what its blocks cover and excludes the rest. */
export type Topic = 'kinematics' | 'synthesis' | 'forces' | 'flywheel' | 'buckling' | 'bearings' | 'tolerances' | 'clearances' | 'study'

/** What evaluating one block gave. */
export interface BlockOutcome {
  readonly block: CalcBlock
  readonly kindLabel: string
  readonly inputs: readonly InputValue[]
  readonly results: readonly NamedValue[]
  readonly method: readonly MethodStep[]
  /** Engineering cautions in plain words. */
  readonly warnings: readonly string[]
  readonly assumptions: readonly Assumption[]
  /** The note's own conclusions (a conclusions block). */
  readonly conclusions: readonly string[]
  /** Names of the results that go into the package summary. */
  readonly summary: readonly string[]
  /** What the block calculates, for the package's scope statement. */
  readonly covers: readonly Topic[]
  readonly sweep: SweepSource | null
  /** The extremes of the block's swept quantities, as a table of named results. */
  readonly extremes: readonly ExtremesRow[]
  readonly checks: readonly CheckOutcome[]
  readonly table: TableOutcome | null
  readonly chart: ChartOutcome | null
  readonly drawing: DrawingOutcome | null
  /** Tables of data the block read (load tables), printed with its inputs. */
  readonly data: readonly DataTable[]
  /** The core analysis, for the blocks that build on this one, or null. */
  readonly core: CoreHandle | null
  /**
   * A package section that prints this block's own content in place of the block
   * (the note's assumptions, its conclusions): the block then points there.
   */
  readonly gathered: 'assumptions' | 'conclusions' | null
}

/** A block kind. */
export interface BlockKind {
  readonly name: string
  /** Heading word, e.g. "Slider-crank". */
  readonly label: string
  /** Whether the block must have an id. */
  readonly needsId: boolean
  /** Evaluated even when a block it uses has errors (it shows what it could not evaluate). */
  readonly toleratesFailedDependencies?: boolean
  /** Ids of other blocks this block uses. */
  dependencies(block: CalcBlock, blockIds: ReadonlySet<string>): Set<string>
  /** Evaluate, reporting problems on the file; null when the block has errors. */
  evaluate(block: CalcBlock, context: EvaluationContext): BlockOutcome | null
}

/** An outcome with nothing but the block and the given parts. */
export function outcome(block: CalcBlock, kindLabel: string, parts: Partial<BlockOutcome>): BlockOutcome {
  return {
    block,
    kindLabel,
    inputs: [],
    results: [],
    method: [],
    warnings: [],
    assumptions: [],
    conclusions: [],
    summary: [],
    covers: [],
    sweep: null,
    extremes: [],
    checks: [],
    table: null,
    chart: null,
    drawing: null,
    data: [],
    core: null,
    gathered: null,
    ...parts,
  }
}
