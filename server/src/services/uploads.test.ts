import { existsSync } from 'node:fs';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pino from 'pino';
import { LocalStorage } from '../storage';
import { slug, storeThenRecord } from './uploads';

describe('storeThenRecord', () => {
  let dir = '';
  beforeAll(async () => {
    dir = await mkdtemp(path.join(os.tmpdir(), 'loadline-store-then-record-'));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  async function received(name: string) {
    const tempPath = path.join(dir, name);
    await writeFile(tempPath, 'hello');
    let cleaned = false;
    return {
      r: {
        fields: {},
        file: { tempPath, size: 5, sha256: 'x', mediaType: 'application/pdf' },
        cleanup: async () => {
          cleaned = true;
          await rm(tempPath, { force: true });
        },
      },
      cleaned: () => cleaned,
    };
  }

  it('removes the stored object again when the database write fails, and always the temporary file', async () => {
    const storage = new LocalStorage(path.join(dir, 'store'));
    const { r, cleaned } = await received('a');
    await expect(
      storeThenRecord(storage, pino({ level: 'silent' }), 'org/documents/a', r, async () => {
        throw new Error('insert failed');
      }),
    ).rejects.toThrow('insert failed');
    expect(await storage.exists('org/documents/a')).toBe(false);
    expect(cleaned()).toBe(true);
    expect(existsSync(r.file.tempPath)).toBe(false);
  });

  it('keeps the object when the write succeeds', async () => {
    const storage = new LocalStorage(path.join(dir, 'store'));
    const { r, cleaned } = await received('b');
    expect(await storeThenRecord(storage, pino({ level: 'silent' }), 'org/documents/b', r, async () => 'row')).toBe('row');
    expect(await storage.exists('org/documents/b')).toBe(true);
    expect(cleaned()).toBe(true);
  });
});

describe('slug', () => {
  it('keeps letters and digits only, so a title cannot break the Content-Disposition header', () => {
    expect(slug('Knee MRI — Résumé "final"\r\nX-Evil: 1')).toBe('knee-mri-resume-final-x-evil-1');
    expect(slug('../../etc/passwd')).toBe('etc-passwd');
    expect(slug('***')).toBe('document');
  });
});
