import { defineConfig } from 'vitest/config';

export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ['unit/**/*.test.ts'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 60_000,
    // Integration tests share one real database: run files one after another.
    fileParallelism: false,
    server: { deps: { inline: [/server-only/] } },
    alias: { 'server-only': new URL('./unit/helpers/server-only-stub.ts', import.meta.url).pathname },
  },
});
