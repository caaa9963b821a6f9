import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const clientRoot = fileURLToPath(new URL('.', import.meta.url));
const repoRoot = fileURLToPath(new URL('..', import.meta.url));

export default defineConfig({
  root: clientRoot,
  plugins: [react(), tailwindcss()],
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
