import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

const root = new URL('../renderer', import.meta.url).pathname;

export default defineConfig({
  root,
  base: './',
  plugins: [react()],
  build: {
    outDir: new URL('../dist/renderer', import.meta.url).pathname,
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: true,
  },
  worker: { format: 'es' },
});
