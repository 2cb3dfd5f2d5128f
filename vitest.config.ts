import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vitest/config';

const here = (p: string) => fileURLToPath(new URL(p, import.meta.url));

export default defineConfig({
  resolve: {
    alias: {
      '@shared': here('./shared'),
      '@server': here('./server'),
      '@': here('./src'),
    },
  },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    testTimeout: 60_000,
    hookTimeout: 180_000,
    // Browser and detector tests are heavy on a 2-core machine; keep the pool small.
    maxWorkers: 2,
  },
});
