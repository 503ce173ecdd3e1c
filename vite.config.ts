import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { defineConfig, type LogLevel, type Plugin } from 'vite';
import preact from '@preact/preset-vite';
import { VitePWA } from 'vite-plugin-pwa';
import { contentSecurityPolicy } from './scripts/csp.ts';

const pkg = JSON.parse(readFileSync(resolve(import.meta.dirname, 'package.json'), 'utf8')) as { version: string };
// FRESHET_VERSION lets the update-flow test build two versions of the same code.
const version = process.env.FRESHET_VERSION ?? pkg.version;
// FRESHET_OUT_DIR lets tests build side by side without touching dist/.
const outDir = resolve(import.meta.dirname, process.env.FRESHET_OUT_DIR ?? 'dist');

export const THEME_COLOUR = '#0d4a5c';
export const BACKGROUND_COLOUR = '#f6f3ec';

// The app build's log level (`--logLevel warn` from npm start), which the service-worker build follows.
let appLogLevel: LogLevel | undefined;

/**
 * A plugin for the service-worker build: one output file via `codeSplitting: false`, not the deprecated
 * option, and the app build's log level (the plugin starts that build with none).
 */
function oneFileWorker(): Plugin {
  return {
    name: 'freshet-one-file-worker',
    config(config) {
      if (appLogLevel && !config.logLevel) config.logLevel = appLogLevel;
      const output = config.build?.rollupOptions?.output;
      if (output && !Array.isArray(output) && 'inlineDynamicImports' in output) {
        delete output.inlineDynamicImports;
        (output as { codeSplitting?: boolean }).codeSplitting = false;
      }
    },
  };
}

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
    { name: 'freshet-log-level', configResolved: (c) => void (appLogLevel = c.logLevel) },
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
        // The plugin asks for one file with `output.inlineDynamicImports`, which Vite 8's bundler has
        // deprecated (it prints a warning on every build); ask for the same single file the current way.
        buildPlugins: { vite: [oneFileWorker()] },
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
