import { expect } from 'vitest';

/** No stack trace, file path or source line ever reaches a client. */
export function expectNoStack(text: string) {
  expect(text).not.toMatch(/"stack"/);
  expect(text).not.toMatch(/^\s*at\s/m);
  expect(text).not.toMatch(/\bat\s+\S+\s+\(.*:\d+:\d+\)/);
  expect(text).not.toMatch(/node_modules|\/server\/src\//);
}
