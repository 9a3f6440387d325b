/**
 * `npm run bench`: every benchmark in one process, printed as Markdown tables
 * with ratios measured in the same run.
 */
import { runCoreBench } from './core.js'
import { machine } from './measure.js'
import { runPackageBench } from './package.js'
import { runFiguresBench } from './figures.js'
import { runPdfBench } from './pdf.js'

const only = process.argv[2]
console.log(`linkwright benchmarks — ${machine()}`)
if (!only || only === 'core') await runCoreBench()
if (!only || only === 'package') await runPackageBench()
if (!only || only === 'figures') await runFiguresBench()
if (!only || only === 'pdf') await runPdfBench()
