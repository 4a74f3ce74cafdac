import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

const webSrc = fileURLToPath(new URL('./web/src', import.meta.url));

export default defineConfig({
  root: 'web',
  plugins: [react(), tailwindcss()],
  resolve: { alias: { '@': webSrc } },
  build: { outDir: '../dist/web', emptyOutDir: true, chunkSizeWarningLimit: 1500 },
  server: { proxy: { '/api': 'http://localhost:3000', '/tiles': 'http://localhost:3000' } },
  test: {
    root: '.',
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          root: '.',
          include: ['tests/physics/**/*.test.ts', 'tests/server/**/*.test.ts', 'tests/jobs/**/*.test.ts', 'tests/web/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          root: '.',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 90_000,
          hookTimeout: 120_000,
          // A browser on a busy two-core host can take more than expect.poll's default second.
          expect: { poll: { timeout: 10_000 } },
          fileParallelism: false,
        },
      },
    ],
  },
});
