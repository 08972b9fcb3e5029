/// <reference types="vitest/config" />
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiTarget = `http://127.0.0.1:${process.env.TONELEDGER_API_PORT || 4010}`;

export default defineConfig({
  // Absolute, so the config works from any working directory (`--config frontend/vite.config.ts`).
  root: fileURLToPath(new URL('.', import.meta.url)),
  plugins: [react(), tailwindcss()],
  resolve: {
    alias: { '@': fileURLToPath(new URL('./src', import.meta.url)) },
  },
  server: {
    // The API and the sign-in routes live on the backend; the browser sees one origin.
    proxy: {
      '/api': { target: apiTarget, xfwd: true },
      '/auth': { target: apiTarget, xfwd: true },
    },
  },
  preview: {
    proxy: {
      '/api': { target: apiTarget, xfwd: true },
      '/auth': { target: apiTarget, xfwd: true },
    },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
  },
  test: {
    name: 'frontend',
    environment: 'jsdom',
    include: ['src/**/*.test.ts', 'src/**/*.test.tsx'],
    setupFiles: ['./src/test/setup.ts'],
  },
});
