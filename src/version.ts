/**
 * The tool's identity for the fingerprint and the package's software section.
 */
import pkg from '../package.json' with { type: 'json' }
import type { Tool } from './notes/note.js'

declare const __LINKWRIGHT_COMMIT__: string | undefined

/** Name and version of this tool. */
export const TOOL: Tool = { name: 'linkwright', version: pkg.version }

/** Source revision the bundle was built from ('unbundled' when run from source). */
export const COMMIT: string = typeof __LINKWRIGHT_COMMIT__ === 'string' ? __LINKWRIGHT_COMMIT__ : 'unbundled'
