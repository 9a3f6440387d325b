import { execFileSync } from 'node:child_process'
import { builtinModules } from 'node:module'
import { defineConfig } from 'vite'

function commit(): string {
  try {
    return execFileSync('git', ['describe', '--always', '--dirty', '--abbrev=12'], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim()
  } catch {
    return 'unknown'
  }
}

// Bundle the CLI, the library entry and the benchmarks for Node 20: one parse of
// a few files starts far faster than thousands of small modules (see DEVELOPERS.md).
export default defineConfig({
  define: { __LINKWRIGHT_COMMIT__: JSON.stringify(commit()) },
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
      },
      output: { format: 'es', entryFileNames: '[name].js', chunkFileNames: 'chunks/[name]-[hash].js' },
      external: [...builtinModules, ...builtinModules.map((m) => `node:${m}`), 'puppeteer-core'],
    },
  },
  ssr: { noExternal: true, external: ['puppeteer-core'] },
})
