import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Express } from 'express';
import pino from 'pino';
import S3rver from 's3rver';
import { CreateBucketCommand } from '@aws-sdk/client-s3';
import { buildApp } from '../../app';
import { loadConfig } from '../../config';
import { createDataSource } from '../../data-source';
import { Clip } from '../../entities';
import { S3Storage } from '../../storage';
import { signedIn, TEST_SECRET } from '../../test/harness';
import { createOrg, TEST_PASSWORD } from '../../test/factories';
import { createLog, webm } from '../../test/worlds/uploads-fixtures';

/**
 * The same upload routes with S3_BUCKET set: the app picks S3Storage from its configuration and talks
 * to s3rver, a fake S3 server started here on loopback with a temporary folder.
 */
describe('uploads stored through the S3 API (s3rver)', () => {
  const bucket = 'loadline-uploads';
  let s3: S3rver;
  let s3Dir = '';
  let app: Express;
  let storage: S3Storage;
  let close: (() => Promise<void>) | undefined;
  const ds = createDataSource(inject('databaseUrl'), 3);

  beforeAll(async () => {
    s3Dir = await mkdtemp(path.join(os.tmpdir(), 'loadline-s3rver-'));
    s3 = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: s3Dir });
    const { port } = await s3.run();
    const env = {
      DATABASE_URL: inject('databaseUrl'),
      SESSION_SECRET: TEST_SECRET,
      LOG_LEVEL: 'silent',
      SIGNIN_MAX_PER_IP: '1000',
      S3_BUCKET: bucket,
      S3_ENDPOINT: `http://127.0.0.1:${port}`,
      S3_REGION: 'us-east-1',
      S3_FORCE_PATH_STYLE: 'true',
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
    };
    const config = loadConfig(env);
    storage = new S3Storage({
      bucket,
      region: 'us-east-1',
      endpoint: env.S3_ENDPOINT,
      forcePathStyle: true,
      credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    });
    await storage.client.send(new CreateBucketCommand({ Bucket: bucket }));
    await ds.initialize();
    const built = buildApp({ ds, config, logger: pino({ level: 'silent' }) });
    app = built.app;
    close = built.close;
  });

  afterAll(async () => {
    await close?.();
    await ds.destroy();
    await s3?.close();
    await rm(s3Dir, { recursive: true, force: true });
  });

  it('uploads a clip into the bucket, serves ranges from it, and deletes it there', async () => {
    const org = await createOrg(ds);
    const log = await createLog(ds, org.id, org.athlete.membershipId);
    const athlete = await signedIn(app, org.athlete.email, TEST_PASSWORD);
    const data = webm(20_000);
    const res = await athlete.agent
      .post(`/api/orgs/${org.id}/clips`)
      .set('x-csrf-token', athlete.csrf)
      .field('athleteId', org.athlete.membershipId)
      .field('trainingLogId', log.id)
      .field('exercise', 'Back squat')
      .attach('file', data, { filename: 'set.webm', contentType: 'video/webm' });
    expect(res.status, res.text).toBe(201);
    const row = await ds.getRepository(Clip).findOneByOrFail({ id: res.body.id });
    expect(await storage.exists(row.storageKey)).toBe(true);

    const part = await athlete.get(res.body.videoPath).set('Range', 'bytes=19990-').buffer(true);
    expect(part.status).toBe(206);
    expect(part.headers['content-range']).toBe('bytes 19990-19999/20000');
    expect(Buffer.compare(part.body as Buffer, data.subarray(19990))).toBe(0);

    expect((await athlete.delete(`/api/orgs/${org.id}/clips/${res.body.id}`)).status).toBe(204);
    expect(await storage.exists(row.storageKey)).toBe(false);
  });
});
