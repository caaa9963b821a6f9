import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';
import { startingShellHtml } from './src/app/layout/starting-shell';

const clientRoot = fileURLToPath(new URL('.', import.meta.url));
const repoRoot = fileURLToPath(new URL('..', import.meta.url));

export default defineConfig({
  root: clientRoot,
  plugins: [
    react(),
    tailwindcss(),
    // The starting frame (brand, "Loading Loadline…", the standing caution) in the page itself, shown
    // before any script has run; React replaces it on its first render (issue 17, first load).
    {
      name: 'loadline-starting-shell',
      transformIndexHtml: (html) => html.replace('<div id="root"></div>', `<div id="root">${startingShellHtml()}</div>`),
    },
    // Installable, and the app's own files load without signal. The service worker precaches the
    // build only: no API answer is ever cached by it (the athlete's offline copy is per person, kept by
    // the app itself in lib/offline-copy.ts and removed at sign-out). A new version waits until every
    // Loadline tab is closed rather than reloading a page mid-form.
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
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    rolldownOptions: {
      // The shared rules and schemas only define things: a screen that uses one schema need not load
      // every schema file the barrel (policies/schemas/index.ts) names. Zod's calls at the top of those
      // files look like side effects to the bundler, which would otherwise keep them all (issue 17).
      treeshake: { moduleSideEffects: [{ test: /[\\/]policies[\\/].*\.ts$/, sideEffects: false }] },
      output: {
        // React and the router change less often than our code and every screen needs them: a chunk of
        // their own stays cached across releases. Other libraries are not grouped, so each one (charts,
        // the table, forms) goes with the lazily loaded screens that use it (issue 17, first load).
        codeSplitting: {
          groups: [{ name: 'react', test: /node_modules[\\/](react|react-dom|react-router|react-router-dom|scheduler)[\\/]/ }],
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
});
