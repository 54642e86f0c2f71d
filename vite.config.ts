import { defineConfig } from 'vite';

// The browser app lives in web/ (React, from the web-app work onward). Vitest has its own
// config (vitest.config.ts) so that tests outside web/ are found.
export default defineConfig({
  root: 'web',
  build: { outDir: '../dist/web', emptyOutDir: true },
  server: { proxy: { '/api': 'http://localhost:3000' } },
});
