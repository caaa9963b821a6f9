import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { AUDIT_SENTENCES } from '../../../policies/words/audit-sentences';

const SERVER = join(import.meta.dirname, '..');

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return name === 'test' ? [] : sources(path);
    // Test fixtures (test/worlds/audit-fixtures.ts writes 'test.entry') are not the server's actions.
    return name.endsWith('.ts') && !name.endsWith('.test.ts') && name !== 'fixtures.ts' ? [path] : [];
  });
}

/** Actions the server writes: `action: '…'` literals (either branch of a ternary), and the tables some commands keep. */
function actionsInSources(): Set<string> {
  const found = new Set<string>();
  const prefixes = new Set(Object.keys(AUDIT_SENTENCES).map((a) => a.split('.')[0]));
  for (const file of sources(SERVER)) {
    const text = readFileSync(file, 'utf8');
    for (const line of text.split('\n')) {
      if (!/\baction:|auditAccount|storeNewRecoveryCodes|linked:|read:/.test(line)) continue;
      for (const m of line.matchAll(/'([a-zA-Z_]+\.[a-z_]+)'/g)) found.add(m[1]);
    }
    // `${prefix}.deleted` and `exception.${status}`: the families built at run time.
    if (text.includes('`${AUDIT[kind].prefix}.deleted`')) for (const p of ['clip', 'case_document']) found.add(`${p}.deleted`);
    if (text.includes('`exception.${x.status}`')) for (const s of ['granted', 'refused']) found.add(`exception.${s}`);
    // Any other literal with a known action's prefix and an action-like verb (e.g. a table of actions).
    for (const m of text.matchAll(/'([a-zA-Z_]+)\.([a-z_]+ed|[a-z_]+_(?:in|out|needed|limited))'/g))
      if (prefixes.has(m[1])) found.add(`${m[1]}.${m[2]}`);
  }
  return found;
}

describe('audit trail sentences cover the server (ASVS 5.0 V16.2.1: entries people can read)', () => {
  it('has a sentence for every action the server records', () => {
    const actions = actionsInSources();
    // The scan itself must find the actions we know are there, or it proves nothing.
    for (const known of ['plan.revised', 'status.changed', 'auth.signed_in', 'access.refused', 'care_team.assigned', 'exception.granted'])
      expect(actions, known).toContain(known);
    const missing = [...actions].filter((a) => !(a in AUDIT_SENTENCES));
    expect(missing).toEqual([]);
  });
});
