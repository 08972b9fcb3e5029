import { defineConfig } from 'vitest/config';

export default defineConfig({ test: { name: 'common', include: ['src/**/*.test.ts'], environment: 'node' } });
