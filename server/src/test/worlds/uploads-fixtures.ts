import { readdir } from 'node:fs/promises';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { CaseRecord, TrainingLog } from '../../entities';

/** Minimal files whose first bytes are those of the real formats (what file-type reads). */
export const PDF = Buffer.from('%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n');
export const PNG = Buffer.from('89504E470D0A1A0A0000000D49484452000000010000000108060000001F15C4890000000049454E44AE426082', 'hex');
/** ISO base media headers: an 'ftyp' box with the brand that names the format. */
export const HEIC = Buffer.concat([Buffer.from('000000186674797068656963000000006d69663168656963', 'hex'), Buffer.alloc(500, 1)]);
export const MOV = Buffer.concat([Buffer.from('00000014667479707174202000000000717420200000000877696465', 'hex'), Buffer.alloc(5000, 2)]);
export const MP4 = Buffer.concat([
  Buffer.from('0000001c667479706973736f6d0000020069736f6d69736f32617663316d703431', 'hex'),
  Buffer.alloc(5000, 3),
]);
export const HTML = Buffer.from('<!doctype html><html><body><script>alert(document.cookie)</script></body></html>\n');

/** An EBML header with DocType "webm", a Segment id, then `size` bytes in all (0..255 repeating, so ranges are checkable). */
export function webm(size = 10_000): Buffer {
  const head = Buffer.from('1A45DFA39F4286810142F7810142F2810442F381084282847765626D428781044285810218538067', 'hex');
  const body = Buffer.alloc(Math.max(0, size - head.length));
  for (let i = 0; i < body.length; i++) body[i] = i % 256;
  return Buffer.concat([head, body]);
}

export async function createCase(ds: DataSource, organizationId: string, athleteId: string): Promise<CaseRecord> {
  return ds.getRepository(CaseRecord).save({
    organizationId,
    athleteId,
    bodyRegions: ['knee_left'],
    onsetDate: '2026-11-01',
    diagnosis: null,
    clinicalNotes: null,
    reviewDate: null,
    openedBy: null,
  });
}

export async function createLog(
  ds: DataSource,
  organizationId: string,
  athleteId: string,
  exercises = ['Back squat', 'Bench press'],
): Promise<TrainingLog> {
  return ds.getRepository(TrainingLog).save({
    organizationId,
    athleteId,
    date: '2026-11-30',
    durationMinutes: 60,
    sessionRpe: 6,
    painBefore: 0,
    painDuring: 1,
    painNextMorning: null,
    painCeiling: 3,
    sets: exercises.map((exercise) => ({ exercise, loadKg: 60, reps: 5 })),
    notes: null,
  });
}

/** Every file below `dir` (temporary `.partial` files included). */
export async function filesUnder(dir: string): Promise<string[]> {
  const entries = await readdir(dir, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile()).map((e) => path.join(e.parentPath, e.name));
}
