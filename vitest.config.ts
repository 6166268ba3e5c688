import { defineConfig } from 'vitest/config';
import { svelte } from '@sveltejs/vite-plugin-svelte';

export default defineConfig({
  plugins: [svelte()],
  resolve: process.env.VITEST ? { conditions: ['browser'] } : undefined,
  test: {
    include: ['tests/**/*.test.ts'],
    reporters: ['default', './tests/support/plainSummaryReporter.ts'],
    // Tests that spawn the command line run its bundle: build it from the current sources first.
    globalSetup: ['./tests/support/buildCliBundle.ts'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 180_000,
    // Two cores here: keep the file-level parallelism modest.
    maxWorkers: 2,
  },
});
