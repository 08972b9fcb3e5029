import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    projects: ['common', 'backend', 'frontend/vite.config.ts', 'e2e'],
  },
});
