import './lib/zod-jitless';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import '@fontsource/public-sans/400.css';
import '@fontsource/public-sans/600.css';
import '@fontsource/public-sans/700.css';
import './index.css';
import { App } from './app/App';

const container = document.getElementById('root');
if (!container) throw new Error('The page has no #root element to mount Loadline into.');

createRoot(container).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
