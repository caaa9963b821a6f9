/**
 * `npm run audit:verify` and `npm run audit:seal` over the services: every chain walked from its
 * start, then checked against its organization's seals (ASVS 5.0 V16.4.3), each line naming the
 * first entry that no longer matches.
 */
import { readdir } from 'node:fs/promises';
import type { EntityManager } from 'typeorm';
import type { ChainReport } from '../server/src/services/audit';
import { checkSeals, readSeals, type SealReport } from '../server/src/services/audit-seal';
import { verifyAllChains } from './backup';

export interface TrailReport {
  chain: ChainReport;
  /** Null for the chain without an organization, and when no key was given. */
  seals: SealReport | null;
}

async function sealedOrganizations(dir: string): Promise<string[]> {
  try {
    return (await readdir(dir)).filter((f) => /^[0-9a-f-]{36}\.jsonl$/.test(f)).map((f) => f.slice(0, -'.jsonl'.length));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
}

/**
 * Every chain, and every organization that has a seal file even if its entries are all gone (a chain
 * deleted whole is not intact just because nothing is left to walk).
 */
export async function verifyTrail(manager: EntityManager, key: string | null, dir: string): Promise<TrailReport[]> {
  const chains = await verifyAllChains(manager);
  for (const id of await sealedOrganizations(dir)) {
    if (!chains.some((c) => c.organizationId === id))
      chains.push({ organizationId: id, entries: 0, intact: true, firstBrokenId: null, reason: null });
  }
  const out: TrailReport[] = [];
  for (const chain of chains) {
    const seals =
      key && chain.organizationId && chain.intact
        ? await checkSeals(manager, chain.organizationId, key, await readSeals(dir, chain.organizationId))
        : null;
    out.push({ chain, seals });
  }
  return out;
}

export function trailIntact(reports: TrailReport[]): boolean {
  return reports.every((r) => r.chain.intact && (r.seals?.intact ?? true));
}

/** One line per chain: `intact` or `BROKEN`, the organization, and what was found. */
export function describeTrail(reports: TrailReport[], keyGiven: boolean): string[] {
  return reports.map(({ chain, seals }) => {
    const label = chain.organizationId ?? '(no organization)';
    if (!chain.intact) return `BROKEN   ${label}  first broken entry #${chain.firstBrokenId}: ${chain.reason}`;
    if (seals && !seals.intact) {
      return seals.firstBrokenId
        ? `BROKEN   ${label}  first broken entry #${seals.firstBrokenId}: ${seals.reason}`
        : `BROKEN   ${label}  seal check failed: ${seals.reason}`;
    }
    const sealNote = !chain.organizationId
      ? ''
      : !keyGiven
        ? '; seals not checked (no AUDIT_SEAL_KEY)'
        : seals?.latest
          ? `; matches ${seals.seals} seal${seals.seals === 1 ? '' : 's'}, the latest of ${seals.latest.sealedAt} up to #${seals.latest.lastEntryId}`
          : '; not sealed yet';
    return `intact   ${label}  ${chain.entries} entries${sealNote}`;
  });
}
