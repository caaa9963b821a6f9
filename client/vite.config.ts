import { readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import { defineConfig, type Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';
import { startingShellHtml } from './src/app/layout/starting-shell';

const clientRoot = fileURLToPath(new URL('.', import.meta.url));
const repoRoot = fileURLToPath(new URL('..', import.meta.url));
const brotli = promisify(zlib.brotliCompress);

/**
 * Each script, style sheet and SVG of the build also as brotli at its highest quality, 11, written beside
 * it; the server sends that file to a browser that offers brotli (server/src/http/client-assets.ts).
 * Quality 11 is too slow to run per request, and a few kB smaller than what the server would do on the fly.
 */
function prebuiltBrotli(): Plugin {
  let outDir = '';
  return {
    name: 'loadline-prebuilt-brotli',
    apply: 'build',
    configResolved: (config) => {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    async writeBundle(_options, bundle) {
      const files = Object.keys(bundle).filter((f) => /\.(?:js|css|svg)$/.test(f));
      await Promise.all(
        files.map(async (f) => {
          const file = path.join(outDir, f);
          const body = await readFile(file);
          if (body.length < 1024) return;
          await writeFile(`${file}.br`, await brotli(body, { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11 } }));
        }),
      );
    },
  };
}

export default defineConfig(({ command }) => ({
  root: clientRoot,
  plugins: [
    react(),
    tailwindcss(),
    // The starting frame (brand, "Loading Loadline…", the standing caution) in the page itself, shown
    // before any script has run; React replaces it on its first render (a fast first load on a slow phone).
    {
      name: 'loadline-starting-shell',
      transformIndexHtml: (html) => html.replace('<div id="root"></div>', `<div id="root">${startingShellHtml()}</div>`),
    },
    // Installable, and the app's own files load without signal. The service worker precaches the
    // build only: no API answer is ever cached by it (the athlete's offline copy is per person, kept by
    // the app itself in lib/offline-copy.ts and removed at sign-out). A new version waits until every
    // Loadline tab is closed rather than reloading a page mid-form.
    prebuiltBrotli(),
    VitePWA({
      registerType: 'prompt',
      injectRegister: false,
      includeAssets: ['favicon.svg', 'icons/apple-touch-icon.png'],
      manifest: {
        id: '/',
        name: 'Loadline',
        short_name: 'Loadline',
        description: 'Getting an injured athlete back to training safely, with the whole care team on one record.',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        // The theme's ink and paper (client/src/index.css).
        theme_color: '#14202e',
        background_color: '#f7f3ec',
        icons: [
          { src: '/icons/loadline-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/icons/loadline-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: '/icons/loadline-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
          { src: '/icons/loadline.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2}'],
        navigateFallback: 'index.html',
        navigateFallbackDenylist: [/^\/api\//],
        runtimeCaching: [],
        cleanupOutdatedCaches: true,
      },
    }),
  ],
  resolve: {
    // React Router 7 names only its development build in its package exports (remix-run/react-router
    // issues 12532 and 14102), so a production bundle carried its developer warnings. Its production
    // build, shipped beside it, is the same code with them off (a fast first load on a slow phone).
    alias:
      command !== 'build'
        ? []
        : [
            {
              find: /^react-router$/,
              replacement: fileURLToPath(new URL('../node_modules/react-router/dist/production/index.mjs', import.meta.url)),
            },
            {
              find: /^react-router\/dom$/,
              replacement: fileURLToPath(new URL('../node_modules/react-router/dist/production/dom-export.mjs', import.meta.url)),
            },
          ],
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    rolldownOptions: {
      // Needed by experimentalInlineCommonChunks below; no chunk is imported by its exports' names from outside.
      preserveEntrySignatures: false,
      // The shared rules and schemas only define things: a screen that uses one schema need not load
      // every schema file the barrel (policies/schemas/index.ts) names. Zod's calls at the top of those
      // files look like side effects to the bundler, which would otherwise keep them all (small first load).
      treeshake: { moduleSideEffects: [{ test: /[\\/]policies[\\/].*\.ts$/, sideEffects: false }] },
      output: {
        // React and the router change less often than our code and every screen needs them: a chunk of
        // their own stays cached across releases. Other libraries are not grouped, so each one (charts,
        // the table, forms) goes with the lazily loaded screens that use it (a small first load).
        codeSplitting: {
          // Common chunks under 12 kB (before minifying) are copied into the chunks that use them rather
          // than fetched on their own: the athlete's home went from 48 files to 11, each a round trip
          // on a slow phone connection, for a few kB more on screens that share many small parts.
          experimentalInlineCommonChunks: { maxSize: 12_000 },
          groups: [
            { name: 'react', test: /node_modules[\\/](react|react-dom|react-router|react-router-dom|scheduler)[\\/]/ },
            { name: 'query', test: /node_modules[\\/]@tanstack[\\/](query-core|react-query)[\\/]/ },
          ],
        },
      },
    },
  },
  server: {
    // The client imports the shared rules from ../policies, which sits outside the client root.
    fs: { allow: [repoRoot] },
    proxy: {
      '/api': `http://127.0.0.1:${process.env.API_PORT ?? 3000}`,
    },
  },
}));
