import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// Vitest runs without globals here, so Testing Library cannot register its own cleanup.
afterEach(() => cleanup());

// Each screen's code is loaded on its first visit, as in the browser (client/src/app/router.tsx); in
// vitest that is a cold transform of the screen and its imports, which on a busy machine takes longer
// than the default one second the find* queries wait, and the first test of a file can pass five.
configure({ asyncUtilTimeout: 15_000 });
vi.setConfig({ testTimeout: 30_000 });
