import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The browser app lives in web/; the build goes to dist/web, which the server serves on :3000.
// Vitest has its own config (vitest.config.ts) so that tests outside web/ are found.
export default defineConfig({
  root: 'web',
  plugins: [react(), tailwindcss()],
  build: { outDir: '../dist/web', emptyOutDir: true, sourcemap: false, chunkSizeWarningLimit: 600 },
  server: { port: 5173, proxy: { '/api': 'http://localhost:3000' } },
});
