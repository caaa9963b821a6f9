import { STANDING_CAUTION } from '../../../../policies/cautions';

/** Text escaped the way React escapes it, so the markup below matches what StartingUp renders. */
const escapeText = (text: string) =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#x27;' })[c]!);

/**
 * What StartingUp (RootLayout.tsx) renders — the brand, "Loading Loadline…" and the standing caution —
 * as plain HTML for index.html's #root (client/vite.config.ts puts it there). The page then shows its
 * frame as soon as it and its style sheet arrive, rather than after the scripts have loaded and run,
 * the app shell of web.dev's "Optimize Largest Contentful Paint"; React replaces it on its first render.
 * starting-shell.test.tsx keeps the two the same.
 */
export function startingShellHtml(): string {
  return (
    '<div class="flex min-h-screen flex-col"><div class="flex-1">' +
    '<header class="border-b border-rule bg-sheet px-4 py-3"><div class="mx-auto max-w-6xl">' +
    '<a class="inline-flex items-center gap-2 rounded text-lg font-bold no-underline" aria-label="Loadline home" href="/" data-discover="true">' +
    '<svg width="26" height="26" viewBox="0 0 32 32" aria-hidden="true" focusable="false"><rect width="32" height="32" rx="6" fill="#14202e"></rect>' +
    '<rect x="7" y="15" width="14" height="8" fill="#f7f3ec"></rect><rect x="22" y="6" width="2" height="20" fill="#c2571a"></rect></svg>' +
    '<span>Loadline</span></a></div></header>' +
    '<main id="main" tabindex="-1" class="mx-auto w-full max-w-md px-4 py-8 focus:outline-none">' +
    '<p role="status" class="py-4 text-sm text-muted">Loading Loadline…</p></main></div>' +
    '<footer class="border-t border-rule px-4 py-3"><div class="mx-auto max-w-6xl">' +
    `<p class="text-xs text-ink-2">${escapeText(STANDING_CAUTION)}</p></div></footer></div>`
  );
}
