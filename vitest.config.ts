import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts', 'test/**/*.test.tsx'],
    exclude: ['test/browser/**', 'node_modules/**'],
    reporters: ['./test/count-reporter.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
