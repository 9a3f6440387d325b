/**
 * The safety caution every output carries (package, results.json, the check
 * command), in one place so that the words are the same everywhere.
 */

/** The caution as one paragraph of plain text. */
export const CAUTION =
  'These calculations describe machinery that can hurt people. The results are for checking by a qualified engineer and rest on the inputs and assumptions stated; they do not replace that engineer’s judgement. Guarding, fatigue, and the local codes and licensed engineering practice that apply govern the design. This package does not claim compliance with any code or standard.'
