/**
 * E-mail throughput: deliveries queued in one transaction (as a team's invitations or a squad's
 * notices are), then worked by the queue's worker into the local fake SMTP server (which parses each
 * message and stores it in PostgreSQL, as in development). Side by side in the same run: the worker as
 * it was (one job at a time, a fresh SMTP connection each) and as the server runs it now (a batch per
 * fetch, MAIL_CONCURRENCY sends at once over pooled connections). Target ≥ 50 messages/s. Reported
 * in the README; never asserted.
 */
import pino from 'pino';
import { createDataSource } from '../server/src/data-source';
import { JobQueue } from '../server/src/jobs/queue';
import { createTransport, deliver, enqueueEmail } from '../server/src/mail/deliveries';
import { startFakeSmtp } from '../server/src/mail/fake-smtp';
import { migrate, openDatabase } from '../scripts/runtime';

const logger = pino({ level: 'silent' });

async function main() {
  const db = await openDatabase('loadline_bench_mail', true);
  try {
    await migrate(db.ownerUrl, db.url);
    const smtp = await startFakeSmtp(db.url, 0);
    const ds = createDataSource(db.url, 20);
    await ds.initialize();
    const runs = [
      { name: 'one at a time (before)', count: Number(process.env.BENCH_MAIL_BEFORE ?? 20), concurrency: 1, batchSize: 1, pool: 0 },
      ...String(process.env.BENCH_MAIL_CONCURRENCY ?? '8,16')
        .split(',')
        .map(Number)
        .map((c) => ({
          name: `pool of ${c} (now)`,
          count: Number(process.env.BENCH_MAIL_COUNT ?? 500),
          concurrency: c,
          batchSize: 50,
          pool: c,
        })),
    ];
    const rows: string[] = [];
    for (const run of runs) {
      const queue = new JobQueue(db.url, logger);
      await queue.start();
      const ids = await ds.transaction(async (m) => {
        const out: string[] = [];
        for (let i = 0; i < run.count; i++) {
          const id = await enqueueEmail(m, queue, {
            organizationId: null,
            kind: 'bench',
            to: `bench-${i}@bench.example`,
            content: { subject: `Bench message ${i}`, greeting: 'Hello,', paragraphs: ['A message of ordinary length for the benchmark.'] },
          });
          out.push(id!);
        }
        return out;
      });
      const transport = createTransport(smtp.url, run.pool || undefined);
      const started = performance.now();
      await queue.work((job) => deliver(ds, transport, logger, job.deliveryId), { concurrency: run.concurrency, batchSize: run.batchSize });
      for (;;) {
        const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM email_deliveries WHERE id = ANY($1) AND status = 'sent'`, [ids]);
        if (n === ids.length) break;
        await new Promise((r) => setTimeout(r, 20));
      }
      const seconds = (performance.now() - started) / 1000;
      const [{ stored }] = await ds.query(`SELECT count(*)::int AS stored FROM fake_mailbox WHERE subject LIKE 'Bench message %'`);
      await queue.stop();
      transport.close();
      await ds.query(`DELETE FROM fake_mailbox`);
      rows.push(`| ${run.name} | ${run.count} | ${seconds.toFixed(2)} s | ${(run.count / seconds).toFixed(1)} | ${stored} |`);
      console.log(rows.at(-1));
    }
    console.log('\n| worker | messages | time | messages/s | stored by the fake SMTP |\n| --- | --- | --- | --- | --- |');
    for (const r of rows) console.log(r);
    await ds.destroy();
    await smtp.stop();
  } finally {
    db.cluster?.stop();
  }
}

await main();
