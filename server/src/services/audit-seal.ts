/**
 * Audit seals: an anchor for each organization's hash chain outside the database (ASVS 5.0 V16.4.3).
 * The chain alone proves nothing against someone who can rewrite entries and recompute every hash
 * after them; a seal records the chain's head (last entry id, its hash, the count) with an HMAC-SHA256
 * under a key the database never sees, and is kept in a file and e-mailed to the organization's admins.
 * A later rewrite changes the sealed entry's hash, and the seal no longer matches.
 */
import { createHash, createHmac, timingSafeEqual } from 'node:crypto';
import { appendFile, mkdir, open, readFile } from 'node:fs/promises';
import path from 'node:path';
import type { EntityManager } from 'typeorm';

const ROOT = path.resolve(import.meta.dirname, '../../..');
export const DEFAULT_AUDIT_SEAL_DIR = path.join(ROOT, '.data', 'audit-seals');

export interface AuditSeal {
  v: 1;
  organizationId: string;
  /** The head of the chain when sealed (audit_entries.id, a bigint as a string). */
  lastEntryId: string;
  /** Entries in the chain up to and including lastEntryId. */
  entries: number;
  headHash: string;
  sealedAt: string;
  /** First 16 hex digits of SHA-256 of the key: tells "another key" from "forged" without revealing it. */
  keyId: string;
  mac: string;
}

export type UnsignedSeal = Omit<AuditSeal, 'mac' | 'keyId' | 'v'>;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
const HEX64 = /^[0-9a-f]{64}$/;

export function keyId(key: string): string {
  return createHash('sha256').update(key, 'utf8').digest('hex').slice(0, 16);
}

/** One field per line, in a fixed order; no field can hold a line break (their shapes are checked). */
export function sealMessage(s: Omit<AuditSeal, 'mac'>): string {
  return ['loadline-audit-seal', s.v, s.organizationId, s.lastEntryId, s.entries, s.headHash, s.sealedAt, s.keyId].join('\n');
}

export function signSeal(key: string, s: UnsignedSeal): AuditSeal {
  const body = { v: 1 as const, ...s, keyId: keyId(key) };
  return { ...body, mac: createHmac('sha256', Buffer.from(key, 'utf8')).update(sealMessage(body)).digest('hex') };
}

export function macValid(key: string, s: AuditSeal): boolean {
  const expected = createHmac('sha256', Buffer.from(key, 'utf8')).update(sealMessage(s)).digest();
  const given = Buffer.from(s.mac, 'hex');
  return given.length === expected.length && timingSafeEqual(given, expected);
}

/** The organization id is a UUID, checked, so it can never name a path outside the folder. */
export function sealFile(dir: string, organizationId: string): string {
  if (!UUID.test(organizationId)) throw new Error(`organizationId ${organizationId} is not a UUID`);
  return path.join(dir, `${organizationId}.jsonl`);
}

/** Appends one seal as a JSON line, flushed to disk before it returns; folder 0700, file 0600. */
export async function appendSeal(dir: string, seal: AuditSeal): Promise<string> {
  await mkdir(dir, { recursive: true, mode: 0o700 });
  const file = sealFile(dir, seal.organizationId);
  await appendFile(file, `${JSON.stringify(seal)}\n`, { mode: 0o600 });
  const fh = await open(file, 'r');
  await fh.sync().finally(() => fh.close());
  return file;
}

function parseSeal(line: string): AuditSeal | null {
  try {
    const s = JSON.parse(line) as AuditSeal;
    const ok =
      s.v === 1 &&
      UUID.test(s.organizationId) &&
      /^[1-9][0-9]*$/.test(s.lastEntryId) &&
      Number.isInteger(s.entries) &&
      HEX64.test(s.headHash) &&
      !Number.isNaN(Date.parse(s.sealedAt)) &&
      /^[0-9a-f]{16}$/.test(s.keyId) &&
      HEX64.test(s.mac);
    return ok ? s : null;
  } catch {
    return null;
  }
}

export interface SealLine {
  line: number;
  seal: AuditSeal | null;
}

/** Every line of the organization's seal file, oldest first; an unreadable line has `seal: null`. */
export async function readSeals(dir: string, organizationId: string): Promise<SealLine[]> {
  let text: string;
  try {
    text = await readFile(sealFile(dir, organizationId), 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
  return text
    .split('\n')
    .map((raw, i) => ({ raw: raw.trim(), line: i + 1 }))
    .filter((l) => l.raw !== '')
    .map((l) => ({ line: l.line, seal: parseSeal(l.raw) }));
}

/** The chain's head now, or null for a chain without entries. */
export async function chainHead(manager: EntityManager, organizationId: string): Promise<UnsignedSeal | null> {
  const rows: { id: string; hash: string; entries: number }[] = await manager.query(
    `SELECT id::text AS id, hash, (SELECT count(*)::int FROM audit_entries c WHERE c.organization_id = $1 AND c.id <= a.id) AS entries
       FROM audit_entries a WHERE a.organization_id = $1 ORDER BY a.id DESC LIMIT 1`,
    [organizationId],
  );
  if (!rows[0]) return null;
  return { organizationId, lastEntryId: rows[0].id, entries: rows[0].entries, headHash: rows[0].hash, sealedAt: new Date().toISOString() };
}

export interface SealReport {
  organizationId: string;
  /** Seals found in the file (readable or not). */
  seals: number;
  /** The newest seal that checked out, if any. */
  latest: AuditSeal | null;
  intact: boolean;
  /** The first sealed entry that no longer matches its seal (or is gone). */
  firstBrokenId: string | null;
  reason: string | null;
}

/**
 * Checks the trail against every seal in the file, oldest first: the MAC must be valid under the key,
 * and the sealed entry must still exist with the sealed hash and the sealed count before it. Because
 * every hash covers all entries before it, a rewrite anywhere up to a sealed entry changes that
 * entry's hash: the first seal that no longer matches names the first sealed entry at or after the
 * change, and the seal before it (still matching) bounds the change from below.
 */
export async function checkSeals(manager: EntityManager, organizationId: string, key: string, lines: SealLine[]): Promise<SealReport> {
  const report: SealReport = { organizationId, seals: lines.length, latest: null, intact: true, firstBrokenId: null, reason: null };
  const broken = (firstBrokenId: string | null, reason: string): SealReport => ({ ...report, intact: false, firstBrokenId, reason });
  const ids = lines.flatMap((l) => (l.seal ? [l.seal.lastEntryId] : []));
  const rows: { id: string; hash: string; entries: number }[] = ids.length
    ? await manager.query(
        `SELECT a.id::text AS id, a.hash,
                (SELECT count(*)::int FROM audit_entries c WHERE c.organization_id = $1 AND c.id <= a.id) AS entries
           FROM audit_entries a WHERE a.organization_id = $1 AND a.id = ANY($2::bigint[])`,
        [organizationId, ids],
      )
    : [];
  const byId = new Map(rows.map((r) => [r.id, r]));
  const myKey = keyId(key);
  for (const { line, seal } of lines) {
    if (!seal) return broken(null, `seal file line ${line} is not a readable seal`);
    if (seal.organizationId !== organizationId)
      return broken(null, `seal file line ${line} belongs to organization ${seal.organizationId}`);
    if (!macValid(key, seal)) {
      const why =
        seal.keyId === myKey ? 'its MAC does not match: the seal was altered' : `it was made with another key (key id ${seal.keyId})`;
      return broken(null, `seal of ${seal.sealedAt} (line ${line}) cannot be trusted: ${why}`);
    }
    const since = report.latest ? `; entry #${report.latest.lastEntryId} (sealed ${report.latest.sealedAt}) still matches` : '';
    const row = byId.get(seal.lastEntryId);
    if (!row) return broken(seal.lastEntryId, `entry #${seal.lastEntryId}, sealed at ${seal.sealedAt}, is gone${since}`);
    if (row.hash !== seal.headHash) {
      return broken(seal.lastEntryId, `no longer matches the seal of ${seal.sealedAt}: the trail was rewritten up to here${since}`);
    }
    if (row.entries !== seal.entries) {
      return broken(seal.lastEntryId, `${row.entries} entries up to here, but ${seal.entries} when sealed at ${seal.sealedAt}${since}`);
    }
    report.latest = seal;
  }
  return report;
}
