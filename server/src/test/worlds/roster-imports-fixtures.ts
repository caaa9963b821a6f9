import { expect } from 'vitest';
import type { RosterImportDto } from '../../../../policies/dto';
import { ROSTER_COLUMNS } from '../../../../policies/roster';
import type { Client } from '../harness';

/** Helpers of the roster import tests: a CSV in the template's columns, the upload, and waiting for the job. */
type Cells = Partial<Record<(typeof ROSTER_COLUMNS)[number], string>>;
export const rosterCsv = (rows: Cells[]) =>
  [ROSTER_COLUMNS.join(','), ...rows.map((r) => ROSTER_COLUMNS.map((c) => `"${(r[c] ?? '').replace(/"/g, '""')}"`).join(','))].join('\r\n');

export const upload = (c: Client, orgId: string, csv: string | Buffer, name = 'roster.csv') =>
  c.agent
    .post(`/api/orgs/${orgId}/roster-imports`)
    .set('x-csrf-token', c.csrf)
    .attach('file', Buffer.from(csv), { filename: name, contentType: 'text/csv' });

/** Polls the import until the job has finished it (or `ms` pass). */
export async function waitDone(c: Client, orgId: string, id: string, ms = 60_000): Promise<RosterImportDto> {
  const end = Date.now() + ms;
  for (;;) {
    const res = await c.get(`/api/orgs/${orgId}/roster-imports/${id}`);
    expect(res.status).toBe(200);
    if (res.body.status === 'done' || res.body.status === 'failed' || Date.now() > end) return res.body;
    await new Promise((r) => setTimeout(r, 200));
  }
}
