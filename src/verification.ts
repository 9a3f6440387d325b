/**
 * How the tool is verified, for the package's calculation-software section: the
 * outside sources its test suite checks the core against, each with how well the
 * source is known and the test file that holds the check (a test keeps this list
 * and the suite in step), and the number of test cases at this revision.
 */

/** One outside check of the test suite. */
export interface VerificationCheck {
  /** What is checked, in a few words. */
  readonly what: string
  /** The source: author, title, edition, section — or the independent referee. */
  readonly source: string
  /** How well the source is known. */
  readonly standing: 'confirmed' | 'textbook example' | 'from memory' | 'derived' | 'independent library' | 'common practice, no source'
  /** The test file that holds the check, and a phrase found in it. */
  readonly test: string
  readonly mark: string
}

/** The outside checks, grouped by topic. */
export const VERIFICATION: readonly VerificationCheck[] = [
  { what: 'in-line stroke = 2 × crank, exact piston displacement', source: 'J. B. Heywood, Internal Combustion Engine Fundamentals, McGraw-Hill, 1988, §2.2', standing: 'from memory', test: 'test/linkage/slider-crank.test.ts', mark: 'SC-1' },
  { what: 'two-term (primary + secondary) displacement and its error', source: 'R. L. Norton, Design of Machinery, McGraw-Hill, 5th ed., 2012, ch. 13', standing: 'from memory', test: 'test/linkage/slider-crank.test.ts', mark: 'SC-2' },
  { what: 'exact piston velocity and acceleration, dead-centre accelerations', source: 'derived in closed form; field-check cases SC-3', standing: 'derived', test: 'test/linkage/slider-crank.test.ts', mark: 'SC-3' },
  { what: 'crank angle of the greatest piston speed', source: 'R. S. Khurmi, J. K. Gupta, Theory of Machines, S. Chand, Example 15.3 (edition not confirmed)', standing: 'textbook example', test: 'test/linkage/slider-crank.test.ts', mark: 'Example 15.3' },
  { what: 'offset stroke, dead-centre angles and time ratio', source: 'J. J. Uicker, G. R. Pennock, J. E. Shigley, Theory of Machines and Mechanisms, Oxford University Press, 3rd ed., 2003', standing: 'from memory', test: 'test/linkage/slider-crank.test.ts', mark: 'OSC-1' },
  { what: 'Grashof condition and classes', source: 'W.-T. Chang, C.-C. Lin, L.-I. Wu, “A note on Grashof’s theorem”, J. Marine Science and Technology 13(4), 2005', standing: 'confirmed', test: 'test/linkage/four-bar.test.ts', mark: 'FB-1' },
  { what: 'four-bar position on both circuits (Freudenstein’s equation)', source: 'F. Freudenstein, “Approximate synthesis of four-bar linkages”, Trans. ASME 77, 1955', standing: 'from memory', test: 'test/linkage/four-bar.test.ts', mark: 'FB-2' },
  { what: 'four-bar example θ3 = 20.298°, θ4 = 57.325°', source: 'R. L. Norton, Design of Machinery, 5th ed., Example 4-1', standing: 'from memory', test: 'test/linkage/four-bar.test.ts', mark: 'Example 4-1' },
  { what: 'transmission-angle extremes at θ2 = 0° and 180°; the worst of μmin and 180° − μmax', source: 'law of cosines; the criterion after H. Alt (1932), as surveyed by S. S. Balli, S. Chand, Mechanism and Machine Theory 37, 2002', standing: 'derived', test: 'test/linkage/four-bar.test.ts', mark: 'FB-3' },
  { what: 'crank-rocker toggles, output swing and time ratio', source: 'toggle construction, derived; field-check case FB-5', standing: 'derived', test: 'test/linkage/four-bar.test.ts', mark: 'FB-5' },
  { what: 'unit-time-ratio crank-rocker', source: 'R. J. Brodell, A. H. Soni, “Design of the crank-rocker mechanism with unit time ratio”, J. Mechanisms 5, 1970', standing: 'from memory', test: 'test/linkage/four-bar.test.ts', mark: 'FB-6' },
  { what: 'parallelogram, antiparallelogram and deltoid change-point linkages', source: 'elementary geometry (a parallelogram’s output copies its input; the equilateral poses of a deltoid)', standing: 'derived', test: 'test/linkage/four-bar.test.ts', mark: 'change-point linkages' },
  { what: 'offset slider-crank synthesis for stroke and time ratio', source: 'the two dead-centre triangles, derived; field-check case SY-1', standing: 'derived', test: 'test/linkage/synthesis.test.ts', mark: 'SY-1' },
  { what: 'crank-rocker for a swing and a time ratio by the toggle circle, and the unit-time-ratio case (a² + d² = b² + c², sin(ψ/2) = a/c)', source: 'toggle-circle construction, derived; field-check cases FB-6 and FB-8', standing: 'derived', test: 'test/linkage/design-synthesis.test.ts', mark: 'FB-8' },
  { what: 'three-point function generator: Chebyshev spacing and Freudenstein’s three equations', source: 'field-check case FB-7; mathjs’s general linear solver (npm) as referee', standing: 'independent library', test: 'test/linkage/design-synthesis.test.ts', mark: 'FB-7' },
  { what: 'stroke tolerance of an offset slider-crank: sensitivities, linear worst case, RSS, exact corners, Monte Carlo spread', source: 'hand-derived partial derivatives of the stroke, checked by the exact corners; field-check case TS-2', standing: 'derived', test: 'test/notes/tolerances.test.ts', mark: 'TS-2' },
  { what: 'ISO 2768-1 general tolerances, class m over 6 up to 400 mm and class f over 30 up to 400 mm', source: 'ISO 2768-1:1989, General tolerances, Part 1, Table 1 (the other entries from memory)', standing: 'confirmed', test: 'test/notes/tolerances.test.ts', mark: 'ISO 2768-1' },
  { what: 'crank torque −F·dx/dθ, rod force F/cos φ and guide thrust F·tan φ of a slider force', source: 'virtual work; field-check case TQ-1 (the crank-effort form as in R. S. Khurmi, J. K. Gupta, Theory of Machines, ch. 15)', standing: 'from memory', test: 'test/linkage/forces.test.ts', mark: 'TQ-1' },
  { what: 'piston effort, rod thrust, guide force and turning moment of a steam engine', source: 'R. S. Khurmi, J. K. Gupta, Theory of Machines, S. Chand, Example 15.7 (the book’s method; edition not confirmed)', standing: 'textbook example', test: 'test/linkage/forces.test.ts', mark: 'Example 15.7' },
  { what: 'two-mass connecting rod and its inertia error', source: 'field-check case DY-1 (equivalent dynamical system as in Khurmi & Gupta, ch. 15)', standing: 'from memory', test: 'test/linkage/forces.test.ts', mark: 'DY-1' },
  { what: 'primary and secondary inertia force, exact values at the dead centres', source: 'R. L. Norton, Design of Machinery, ch. 13; field-check case DY-2', standing: 'from memory', test: 'test/linkage/forces.test.ts', mark: 'DY-2' },
  { what: 'slider-crank and four-bar force analysis: drive power = rate of kinetic and potential energy + load power at every angle', source: 'the power balance (virtual work), an independent referee', standing: 'derived', test: 'test/linkage/forces.test.ts', mark: 'power balance' },
  { what: 'flywheel energy fluctuation and inertia I = ΔE/(Cs ω²)', source: 'R. G. Budynas, J. K. Nisbett, Shigley’s Mechanical Engineering Design, 9th ed., §16-12; field-check case FW-1', standing: 'from memory', test: 'test/linkage/flywheel.test.ts', mark: 'FW-1' },
  { what: 'flywheel examples: ΔE of 5000 + 600 sin 2θ against 5000 + 500 sin θ; 300 kW at 90 rpm; a rim for 7 MPa hoop stress', source: 'R. S. Khurmi, J. K. Gupta, Theory of Machines, ch. 16, Examples 16.3, 16.12, 16.13, 16.14 (printed answers seen in a published re-working)', standing: 'textbook example', test: 'test/linkage/flywheel.test.ts', mark: 'Example 16.3' },
  { what: 'the sized flywheel in motion reproduces its coefficient of speed fluctuation', source: 'odex (npm), a general-purpose ODE integrator, as referee', standing: 'independent library', test: 'test/linkage/flywheel.test.ts', mark: 'odex' },
  { what: 'Euler column, transition slenderness, Johnson parabola', source: 'R. G. Budynas, J. K. Nisbett, Shigley’s Mechanical Engineering Design, 9th ed., §4-12, §4-13, Example 4-17; field-check cases BK-1, BK-2', standing: 'confirmed', test: 'test/linkage/column.test.ts', mark: 'BK-1' },
  { what: 'a machine link sized as a column (Euler trial, then Johnson)', source: 'R. L. Mott, Machine Elements in Mechanical Design, ch. 6 (edition from memory)', standing: 'textbook example', test: 'test/linkage/column.test.ts', mark: 'Mott' },
  { what: 'mean slider speed 2·S·n', source: 'J. B. Heywood, Internal Combustion Engine Fundamentals, 1988, §2.2', standing: 'from memory', test: 'test/linkage/slider-crank.test.ts', mark: 'mean piston speed' },
  { what: 'first and second derivatives of the slider position', source: 'symbolic differentiation by mathjs (npm), an independent referee', standing: 'independent library', test: 'test/linkage/referee.test.ts', mark: 'mathjs' },
  { what: 'loop closure, derivatives against central differences, sweep extremes, Grashof against the input range, limits of long links', source: 'property tests over thousands of random linkages (fast-check, npm)', standing: 'independent library', test: 'test/linkage/properties.test.ts', mark: 'fc.' },
]

declare const __LINKWRIGHT_TESTS__: number | undefined

/** Test cases in the suite at the revision the bundle was built from, or null when run from source. */
export const TEST_COUNT: number | null = typeof __LINKWRIGHT_TESTS__ === 'number' ? __LINKWRIGHT_TESTS__ : null
