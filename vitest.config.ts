import { defineConfig } from 'vitest/config'

// Kept apart from vite.config.ts: the bundling config inlines every dependency,
// which would make vitest transform them all.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: 'forks',
  },
})
