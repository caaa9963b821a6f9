import './lib/zod-jitless';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import '@fontsource/public-sans/400.css';
import '@fontsource/public-sans/600.css';
import '@fontsource/public-sans/700.css';
import './index.css';
import { registerSW } from 'virtual:pwa-register';
import { App } from './app/App';

const container = document.getElementById('root');
if (!container) throw new Error('The page has no #root element to mount Loadline into.');

createRoot(container).render(
  <StrictMode>
    <App />
  </StrictMode>,
);

// The service worker (client/vite.config.ts) makes the app installable and its files load offline.
registerSW({ immediate: true });
