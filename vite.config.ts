import { execFileSync } from 'node:child_process'
import { readFileSync, readdirSync } from 'node:fs'
import { builtinModules } from 'node:module'
import { join } from 'node:path'
import { defineConfig } from 'vite'

function commit(): string {
  try {
    return execFileSync('git', ['describe', '--always', '--dirty', '--abbrev=12'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim()
  } catch {
    return 'unknown'
  }
}

/** Test cases in test/ (each \`it(\` call), for the package's calculation-software section. */
function testCount(): number {
  let count = 0
  const walk = (dir: string): void => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, entry.name)
      if (entry.isDirectory()) walk(path)
      else if (entry.name.endsWith('.test.ts')) count += (readFileSync(path, 'utf8').match(/^\s*it\(/gm) ?? []).length
    }
  }
  walk('test')
  return count
}

// Bundle the CLI, the library entry and the benchmarks for Node 20: one parse of
// a few files starts far faster than thousands of small modules (see DEVELOPERS.md).
export default defineConfig({
  define: { __LINKWRIGHT_COMMIT__: JSON.stringify(commit()), __LINKWRIGHT_TESTS__: String(testCount()) },
  build: {
    ssr: true,
    target: 'node20',
    outDir: 'dist',
    emptyOutDir: true,
    minify: false,
    sourcemap: false,
    rollupOptions: {
      input: {
        cli: 'src/cli/main.ts',
        index: 'src/index.ts',
        bench: 'bench/run.ts',
        'build-worker': 'src/cli/build-worker.ts',
      },
      output: { format: 'es', entryFileNames: '[name].js', chunkFileNames: 'chunks/[name]-[hash].js' },
      external: [...builtinModules, ...builtinModules.map((m) => `node:${m}`), 'puppeteer-core'],
    },
  },
  ssr: { noExternal: true, external: ['puppeteer-core'] },
})
