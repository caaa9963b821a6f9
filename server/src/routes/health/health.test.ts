import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { useHarness } from '../../test/harness';

describe('GET /api/health', () => {
  const h = useHarness();

  it('answers 200 with the database up', async () => {
    const res = await request(h.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: 'up' });
    expect(res.headers['cache-control']).toBe('no-store');
  });
});
