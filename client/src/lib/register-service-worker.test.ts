import { describe, expect, it, vi } from 'vitest';
import { registerServiceWorkerWhenIdle } from './register-service-worker';

/** A window that is still loading, whose load event and idle time the test sets off by hand. */
function loadingWindow(withIdle: boolean) {
  const listeners: Array<() => void> = [];
  const idle: Array<() => void> = [];
  const timers: Array<() => void> = [];
  const win = {
    document: { readyState: 'loading' },
    addEventListener: (type: string, fn: () => void) => type === 'load' && listeners.push(fn),
    requestIdleCallback: withIdle ? (fn: () => void) => idle.push(fn) : undefined,
    setTimeout: (fn: () => void) => timers.push(fn),
  } as unknown as Window;
  const load = () => {
    (win.document as { readyState: string }).readyState = 'complete';
    listeners.forEach((fn) => fn());
  };
  return { win, load, idle, timers };
}

const shown = { settled: () => true, subscribe: () => () => undefined };

describe('service worker registration waits for the first screen (web.dev "Service worker registration")', () => {
  it('registers only after the page has loaded and the browser is idle', () => {
    const register = vi.fn();
    const { win, load, idle } = loadingWindow(true);
    registerServiceWorkerWhenIdle(register, shown, win);
    expect(register).not.toHaveBeenCalled();
    load();
    expect(register).not.toHaveBeenCalled();
    idle.forEach((fn) => fn());
    expect(register).toHaveBeenCalledTimes(1);
  });

  it('without requestIdleCallback (Safari), registers a moment after load', () => {
    const register = vi.fn();
    const { win, load, timers } = loadingWindow(false);
    registerServiceWorkerWhenIdle(register, shown, win);
    load();
    expect(register).not.toHaveBeenCalled();
    timers.forEach((fn) => fn());
    expect(register).toHaveBeenCalledTimes(1);
  });

  it('on a page that has already loaded, waits only for idle time', () => {
    const register = vi.fn();
    const { win, load, idle } = loadingWindow(true);
    load();
    registerServiceWorkerWhenIdle(register, shown, win);
    idle.forEach((fn) => fn());
    expect(register).toHaveBeenCalledTimes(1);
  });

  it('while the screen asked for is still loading its code or data, waits until it is shown, then for idle time', () => {
    const register = vi.fn();
    const { win, load, idle } = loadingWindow(true);
    let settled = false;
    const listeners: Array<() => void> = [];
    const screen = {
      settled: () => settled,
      subscribe: (fn: () => void) => {
        listeners.push(fn);
        return () => void listeners.splice(listeners.indexOf(fn), 1);
      },
    };
    registerServiceWorkerWhenIdle(register, screen, win);
    load();
    idle.splice(0).forEach((fn) => fn());
    expect(register).not.toHaveBeenCalled();
    settled = true;
    [...listeners].forEach((fn) => fn());
    expect(listeners).toHaveLength(0);
    expect(register).not.toHaveBeenCalled();
    idle.splice(0).forEach((fn) => fn());
    expect(register).toHaveBeenCalledTimes(1);
  });
});
