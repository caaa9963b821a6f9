/**
 * The service worker (client/vite.config.ts) makes the app installable and its files load offline. Once
 * installed it fetches every screen's files to keep them (about 1.8 MB): registered at once, that
 * download and its own script shared a slow connection with the first screen's files. It is registered
 * once the page has loaded and the browser is idle instead, as web.dev's "Service worker registration"
 * advises (issue 17, first load); a later visit is served by it as before.
 */
export function registerServiceWorkerWhenIdle(register: () => void, win: Window = window): void {
  const whenIdle = () => {
    if (typeof win.requestIdleCallback === 'function') win.requestIdleCallback(register, { timeout: 5_000 });
    else win.setTimeout(register, 1_000);
  };
  if (win.document.readyState === 'complete') whenIdle();
  else win.addEventListener('load', whenIdle, { once: true });
}
