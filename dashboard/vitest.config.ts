import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineProject } from 'vitest/config';

// Component tests (jsdom) and browser tests (playwright-core + Debian chromium, e2e/; those files
// declare `// @vitest-environment node`).
export default defineProject({
  plugins: [react()],
  test: {
    name: 'dashboard',
    root: fileURLToPath(new URL('.', import.meta.url)),
    include: ['src/**/*.test.{ts,tsx}', 'build/**/*.test.ts', 'e2e/**/*.e2e.test.ts'],
    environment: 'jsdom',
    testTimeout: 60_000,
    hookTimeout: 180_000,
  },
});
