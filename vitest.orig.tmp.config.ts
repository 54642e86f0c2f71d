import react from '@vitejs/plugin-react';
import { configDefaults, defineConfig } from 'vitest/config';

// Two projects: everything but the browser tests, and the browser tests (tests/e2e), whose
// globalSetup builds dist/web first. A project's globalSetup runs only when one of its files is
// queued, so `npx vitest run tests/unit` builds nothing.
export default defineConfig({
  plugins: [react()],
  test: {
    environment: 'node',
    testTimeout: 60000,
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'], exclude: [...configDefaults.exclude, 'tests/e2e/**'] },
      },
      {
        extends: true,
        test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], globalSetup: ['tests/e2e/global-setup.ts'], testTimeout: 240_000, hookTimeout: 120_000 },
      },
    ],
  },
});
