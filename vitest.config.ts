import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

export default defineConfig({
  // the examples import the package by name, as a project that installed it would; here it is the sources
  resolve: { alias: [{ find: /^bellstep$/, replacement: fileURLToPath(new URL('./src/index.ts', import.meta.url)) }] },
  test: {
    include: ['test/**/*.test.ts', 'test/**/*.test.tsx', 'examples/**/*.test.ts'],
    exclude: ['dist/**', 'dist-bench/**', 'node_modules/**'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
