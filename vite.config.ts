import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const sharedDir = fileURLToPath(new URL('./shared', import.meta.url));
const srcDir = fileURLToPath(new URL('./src', import.meta.url));
const apiPort = process.env.API_PORT ?? '3001';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias: { '@shared': sharedDir, '@': srcDir } },
  build: { outDir: 'dist/client', emptyOutDir: true, sourcemap: true },
  server: {
    host: '127.0.0.1',
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
  test: {
    globalSetup: ['tests/support/global-setup.ts'],
    testTimeout: 20_000,
    hookTimeout: 60_000,
    pool: 'forks',
    projects: [
      { extends: true, test: { name: 'unit+api', include: ['tests/unit/**/*.test.ts', 'tests/api/**/*.test.ts'] } },
      // Browser tests drive the built client in Chromium; one file at a time keeps the two cores for the browser.
      { extends: true, test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], testTimeout: 60_000, fileParallelism: false } },
    ],
  },
});
