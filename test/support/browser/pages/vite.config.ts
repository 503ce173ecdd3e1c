// Builds the test-only storage page (db.html) into dist-test-pages/ for the browser test and benchmark.
import { resolve } from 'node:path';
import { defineConfig } from 'vite';

export default defineConfig({
  root: import.meta.dirname,
  publicDir: false,
  logLevel: 'warn',
  build: {
    outDir: resolve(import.meta.dirname, '../../../../dist-test-pages'),
    emptyOutDir: true,
    target: 'es2022',
    rollupOptions: {
      input: {
        index: resolve(import.meta.dirname, 'index.html'),
        db: resolve(import.meta.dirname, 'db.html'),
        logger: resolve(import.meta.dirname, 'logger.html'),
        plot: resolve(import.meta.dirname, 'plot.html'),
        photo: resolve(import.meta.dirname, 'photo.html'),
      },
    },
  },
});
