/**
 * `npm run bench`: every benchmark in one process, with ratios measured in the
 * same run. `npm run bench -- core` (dynamics, tolerance, package, figures, pdf, fuzz, preview, repository) runs one (repository only when named: it takes minutes);
 * `-- --json` prints one JSON object instead of Markdown tables.
 */
import { runCoreBench } from './core.js'
import { runDynamicsBench } from './dynamics.js'
import { runToleranceBench } from './tolerance.js'
import { json, markdown } from './measure.js'
import { runPackageBench } from './package.js'
import { runFiguresBench } from './figures.js'
import { runPdfBench } from './pdf.js'
import { runFuzzBench } from './fuzz.js'
import { runRepositoryBench } from './repository.js'
import { runPreviewBench } from './preview.js'

const args = process.argv.slice(2)
const asJson = args.includes('--json')
const only = args.filter((a) => !a.startsWith('--'))
const wanted = (name: string) => only.length === 0 || only.includes(name)
if (wanted('core')) await runCoreBench()
if (wanted('dynamics')) await runDynamicsBench()
if (wanted('tolerance')) await runToleranceBench()
if (wanted('package')) await runPackageBench()
if (wanted('figures')) await runFiguresBench()
if (wanted('pdf')) await runPdfBench()
if (wanted('fuzz')) await runFuzzBench()
// Minutes of builds: only when asked for by name.
if (only.includes('repository')) await runRepositoryBench()
if (wanted('preview')) await runPreviewBench()
process.stdout.write(asJson ? json() : markdown())
