import { describe, expect, it } from 'vitest';
import { publicBaseUrl } from './public-url';

describe('publicBaseUrl: where links in e-mails point (never the request’s Host)', () => {
  it('is PUBLIC_URL when configured, without a trailing slash', () => {
    expect(publicBaseUrl({ PUBLIC_URL: 'https://app.loadline.example/', HOST: '0.0.0.0', PORT: 8080 })).toBe(
      'https://app.loadline.example',
    );
    expect(publicBaseUrl({ PUBLIC_URL: 'https://loadline.example/club', HOST: '0.0.0.0', PORT: 8080 })).toBe(
      'https://loadline.example/club',
    );
  });

  it("is the server's own configured address otherwise", () => {
    expect(publicBaseUrl({ PUBLIC_URL: undefined, HOST: '127.0.0.1', PORT: 3000 })).toBe('http://127.0.0.1:3000');
  });
});
