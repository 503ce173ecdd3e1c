import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { defineConfig } from 'vite';
import preact from '@preact/preset-vite';
import { VitePWA } from 'vite-plugin-pwa';
import { contentSecurityPolicy } from './scripts/csp';

const pkg = JSON.parse(readFileSync(resolve(import.meta.dirname, 'package.json'), 'utf8')) as { version: string };
// FRESHET_VERSION lets the update-flow test build two versions of the same code.
const version = process.env.FRESHET_VERSION ?? pkg.version;
// FRESHET_OUT_DIR lets tests build side by side without touching dist/.
const outDir = resolve(import.meta.dirname, process.env.FRESHET_OUT_DIR ?? 'dist');

export const THEME_COLOUR = '#0d4a5c';
export const BACKGROUND_COLOUR = '#f6f3ec';

export default defineConfig({
  root: resolve(import.meta.dirname, 'web'),
  publicDir: resolve(import.meta.dirname, 'public'),
  define: { __APP_VERSION__: JSON.stringify(version) },
  build: {
    outDir, emptyOutDir: true, target: 'es2022', sourcemap: false,
    rolldownOptions: {
      // Our own modules (core/, web/) do nothing when imported but define things; saying so lets the
      // bundler leave out of a chunk whatever a barrel (core/index.ts, web/db/index.ts) re-exports and
      // that chunk does not use, so the first screen does not load the storm analysis or the logger
      // import. Stylesheets are imported for their effect and stay.
      treeshake: { moduleSideEffects: (id: string) => !/[\\/](core|web)[\\/][^?]*\.tsx?$/.test(id) },
    },
  },
  // The preview server sends the policy as a header too, with frame-ancestors (a meta tag cannot).
  preview: { host: '127.0.0.1', port: 4173, strictPort: true, headers: { 'Content-Security-Policy': contentSecurityPolicy({ frameAncestors: "'none'" }) } },
  plugins: [
    preact(),
    {
      // The built index.html carries the policy as its first <meta>, so any host serves it; the dev
      // server gets none (its hot reload needs inline scripts and a websocket).
      name: 'freshet-csp',
      apply: 'build',
      transformIndexHtml: (html: string) =>
        html.replace('<meta charset="utf-8" />', `<meta charset="utf-8" />\n    <meta http-equiv="Content-Security-Policy" content="${contentSecurityPolicy()}" />`),
    },
    VitePWA({
      strategies: 'injectManifest',
      srcDir: '../sw',
      filename: 'sw.ts',
      injectRegister: false,
      registerType: 'prompt',
      injectManifest: {
        // Only the app shell: the plugin adds the manifest and icons itself.
        globPatterns: ['**/*.{js,css,html}'],
        rollupFormat: 'es',
      },
      manifest: {
        name: 'Freshet — stream gauging in the field',
        short_name: 'Freshet',
        description: 'Stage readings, discharge, gaugings and storm runoff at the stream bank, offline.',
        id: './',
        start_url: './',
        scope: './',
        display: 'standalone',
        orientation: 'portrait',
        theme_color: THEME_COLOUR,
        background_color: BACKGROUND_COLOUR,
        icons: [
          { src: 'icons/freshet.svg', sizes: 'any', type: 'image/svg+xml' },
          { src: 'icons/freshet-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: 'icons/freshet-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: 'icons/freshet-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
    }),
  ],
});
