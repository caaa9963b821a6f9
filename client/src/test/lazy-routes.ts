import type { RouteObject } from 'react-router-dom';

/**
 * Loads the code of every screen of these routes. The app loads each screen on its first visit
 * (router.tsx); in vitest that would be a cold transform of the screen and its imports inside the first
 * test that visits it, which on a busy machine outlasts the find* queries' wait. Awaited at the top of
 * the file, the cost falls at import time, as it did when every screen was imported at once.
 */
export async function loadAllScreens(routes: RouteObject[]): Promise<void> {
  const lazies: Promise<unknown>[] = [];
  const walk = (list: RouteObject[]) => {
    for (const route of list) {
      if (typeof route.lazy === 'function') lazies.push(route.lazy());
      if (route.children) walk(route.children);
    }
  };
  walk(routes);
  await Promise.all(lazies);
}
