/**
 * References the tool itself cites from its method steps. Only sources whose
 * wording was checked against a published copy are cited here.
 */

/** Built-in reference key → full citation. */
export const builtinReferences: ReadonlyMap<string, string> = new Map([
  [
    'lw-grashof',
    'W.-T. Chang, C.-C. Lin, L.-I. Wu, “A note on Grashof’s theorem”, Journal of Marine Science and Technology 13(4), 2005, pp. 239–248 (statement and proof history of the Grashof condition).',
  ],
  [
    'lw-transmission',
    'S. S. Balli, S. Chand, “Transmission angle in mechanisms”, Mechanism and Machine Theory 37, 2002, pp. 175–195 (survey; the transmission angle as a design criterion goes back to H. Alt, 1932).',
  ],
  [
    'lw-column',
    'R. G. Budynas, J. K. Nisbett, Shigley’s Mechanical Engineering Design, 9th ed., McGraw-Hill, 2011, §4-12 and §4-13, Eqs. (4-45) and (4-46) (Euler and Johnson critical loads, the tangent point at S_y/2).',
  ],
])
