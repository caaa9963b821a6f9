/** What registration waits on: whether the screen asked for is shown (no route's code or data on its way). */
export interface ScreenState {
  settled: () => boolean;
  subscribe: (onChange: () => void) => () => void;
}

/**
 * The service worker (client/vite.config.ts) makes the app installable and its files load offline. Once
 * installed it fetches every screen's files to keep them (about 1.8 MB): registered at once, that
 * download and its own script shared a slow connection with the first screen's files. It is registered
 * once the page has loaded, the screen asked for is shown and the browser is idle instead, as web.dev's
 * "Service worker registration" advises (a fast first load); a later visit is served by it as before.
 */
export function registerServiceWorkerWhenIdle(register: () => void, screen: ScreenState, win: Window = window): void {
  let done = false;
  const attempt = () => {
    if (done) return;
    if (!screen.settled()) {
      const stop = screen.subscribe(() => {
        if (!screen.settled()) return;
        stop();
        whenIdle();
      });
      return;
    }
    done = true;
    register();
  };
  const whenIdle = () => {
    if (typeof win.requestIdleCallback === 'function') win.requestIdleCallback(attempt, { timeout: 5_000 });
    else win.setTimeout(attempt, 1_000);
  };
  if (win.document.readyState === 'complete') whenIdle();
  else win.addEventListener('load', whenIdle, { once: true });
}
