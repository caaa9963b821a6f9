/**
 * HTTP benchmark: the coach's roster and the athlete's today view under autocannon (50 and 200
 * connections, `BENCH_CONNECTIONS`), against a generated organization of 1,000 athletes with a year
 * of logs, side by side with a bare Express route doing one indexed query on the same database, in
 * the same run: the targets are ratios to it (≥ 0.5 of its requests/s, p99 ≤ 2× its p99), since
 * this machine is shared and absolute times mean little. Reported in the README; never asserted.
 */
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import type { Server } from 'node:http';
import express from 'express';
import pg from 'pg';
import bcrypt from 'bcryptjs';
import { loadConfig } from '../server/src/config';
import { createLogger } from '../server/src/logger';
import { startServer } from '../server/src/server';
import { seedExerciseLibrary } from '../server/src/services/exercise-library';
import { createDataSource } from '../server/src/data-source';
import { migrate, openDatabase } from '../scripts/runtime';

export const ATHLETES = 1000;
export const ROSTER = 50;
const PASSWORD = 'bench-password-long-enough';

export async function generate(url: string, ownerUrl: string) {
  const ds = createDataSource(url, 4);
  await ds.initialize();
  const hash = await bcrypt.hash(PASSWORD, 12);
  const org = randomUUID();
  await ds.query(`INSERT INTO organizations (id, name) VALUES ($1, 'Bench Organization')`, [org]);
  await seedExerciseLibrary(ds.manager, org);
  // Users, memberships and profiles for 1,000 athletes, one coach and one clinician, in set-based SQL.
  await ds.query(
    `INSERT INTO users (id, email, password_hash, display_name, version)
                  SELECT gen_random_uuid(), 'athlete' || g || '@bench.example', $1, 'Athlete ' || g, 1 FROM generate_series(1, $2) g`,
    [hash, ATHLETES],
  );
  await ds.query(
    `INSERT INTO users (id, email, password_hash, display_name, version) VALUES
                  (gen_random_uuid(), 'coach@bench.example', $1, 'Bench Coach', 1), (gen_random_uuid(), 'clinician@bench.example', $1, 'Bench Clinician', 1)`,
    [hash],
  );
  await ds.query(
    `INSERT INTO memberships (organization_id, user_id, roles, version)
                  SELECT $1, id, CASE WHEN email LIKE 'athlete%' THEN ARRAY['athlete'] WHEN email LIKE 'coach%' THEN ARRAY['coach'] ELSE ARRAY['clinician'] END, 1
                    FROM users WHERE email LIKE '%@bench.example'`,
    [org],
  );
  await ds.query(
    `INSERT INTO athlete_profiles (membership_id, organization_id, date_of_birth, sport, version)
                  SELECT m.id, $1, DATE '2000-01-01' + (random() * 3000)::int, 'Bench sport', 1 FROM memberships m WHERE m.organization_id = $1 AND 'athlete' = ANY(m.roles)`,
    [org],
  );
  const athletes: { id: string; email: string }[] = await ds.query(
    `SELECT m.id, u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.organization_id = $1 AND 'athlete' = ANY(m.roles) ORDER BY u.email`,
    [org],
  );
  const [coach] = await ds.query(`SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = 'coach@bench.example'`);
  const [clin] = await ds.query(
    `SELECT m.id FROM memberships m JOIN users u ON u.id = m.user_id WHERE u.email = 'clinician@bench.example'`,
  );
  const roster = athletes.slice(0, ROSTER).map((a) => a.id);
  await ds.query(
    `INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) SELECT $1, a, $2, 'coach' FROM unnest($3::uuid[]) a`,
    [org, coach.id, roster],
  );
  await ds.query(
    `INSERT INTO care_team_assignments (organization_id, athlete_id, member_id, role) SELECT $1, a, $2, 'clinician' FROM unnest($3::uuid[]) a`,
    [org, clin.id, roster],
  );
  // A year of logs: ~4 sessions a week for every athlete (≈ 200,000 rows).
  await ds.query(
    `INSERT INTO training_logs (organization_id, athlete_id, date, duration_minutes, session_rpe, pain_before, pain_during, pain_ceiling, sets, version)
                  SELECT $1, a.id, CURRENT_DATE - d, 45 + (d % 40), 3 + (d % 6), d % 3, (d % 5), 5,
                         '[{"exercise":"Back squat","loadKg":80,"reps":5,"rpe":7}]'::jsonb, 1
                    FROM unnest($2::uuid[]) AS a(id), generate_series(1, 365) d WHERE d % 7 IN (1, 2, 4, 5)`,
    [org, athletes.map((a) => a.id)],
  );
  // Cases with a plan for a fifth of the roster, and a published program for each roster athlete today.
  const [dl] = await ds.query(`SELECT id FROM exercises WHERE organization_id = $1 AND name = 'Deadlift'`, [org]);
  for (const [i, a] of roster.entries()) {
    if (i % 5 === 0) {
      const [c] = await ds.query(
        `INSERT INTO cases (organization_id, athlete_id, body_regions, onset_date, version) VALUES ($1, $2, '{lower_back}', CURRENT_DATE - 10, 1) RETURNING id`,
        [org, a],
      );
      await ds.query(
        `INSERT INTO participation_status_changes (organization_id, athlete_id, case_id, status, effective_from) VALUES ($1, $2, $3, 'limited', CURRENT_DATE - 10)`,
        [org, a, c.id],
      );
      const [p] = await ds.query(
        `INSERT INTO restriction_plans (organization_id, athlete_id, case_id, version) VALUES ($1, $2, $3, 1) RETURNING id`,
        [org, a, c.id],
      );
      const stages = [
        {
          id: randomUUID(),
          startDate: '2020-01-01',
          endDate: '2099-12-31',
          painCeiling: 4,
          patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 70 } }, jump: { mode: 'blocked' } },
        },
      ];
      await ds.query(`INSERT INTO restriction_plan_versions (plan_id, version, stages, guidance) VALUES ($1, 1, $2, 'Bench plan')`, [
        p.id,
        JSON.stringify(stages),
      ]);
    }
    const [prog] = await ds.query(
      `INSERT INTO programs (organization_id, name, athlete_ids, version) VALUES ($1, 'Bench program', ARRAY[$2::uuid], 1) RETURNING id`,
      [org, a],
    );
    const content = {
      exercises: [
        {
          id: randomUUID(),
          exerciseId: dl.id,
          sets: [1, 2, 3].map(() => ({ id: randomUUID(), reps: 5, load: { kind: 'kg', value: 60 }, targetRpe: 6 })),
        },
      ],
    };
    await ds.query(
      `INSERT INTO program_sessions (organization_id, program_id, date, title, content, status, published_at, version)
                    VALUES ($1, $2, CURRENT_DATE, 'Bench day', $3, 'published', now(), 1)`,
      [org, prog.id, JSON.stringify(content)],
    );
  }
  await ds.destroy();
  // ANALYZE as the tables' owner: run as the runtime role it skips every table with only a warning,
  // and the small tables (50 programs, 10 cases) never reach autovacuum's analyze threshold, so the
  // routes were measured with plans built on no statistics (nested loops over mis-estimated CTEs).
  const owner = new pg.Client({ connectionString: ownerUrl });
  await owner.connect();
  try {
    await owner.query('ANALYZE');
  } finally {
    await owner.end();
  }
  return { org, athlete: athletes[0], athleteEmail: athletes[0].email };
}

export async function signIn(base: string, email: string): Promise<string> {
  const s = await fetch(`${base}/api/session`);
  const cookie = s.headers.get('set-cookie')!.split(';')[0];
  const { csrfToken } = (await s.json()) as { csrfToken: string };
  const res = await fetch(`${base}/api/session`, {
    method: 'POST',
    headers: { cookie, 'content-type': 'application/json', 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed for ${email}: ${res.status}`);
  return res.headers.get('set-cookie')!.split(';')[0];
}

interface Result {
  name: string;
  rps: number;
  p99: number;
  p50: number;
  errors: number;
  non2xx: number;
}

/** autocannon in a process of its own (async: this process serves the requests meanwhile). */
async function autocannon(name: string, connections: number, url: string, cookie?: string): Promise<Result> {
  const args = [
    'autocannon',
    '-c',
    String(connections),
    '-d',
    process.env.BENCH_SECONDS ?? '10',
    '-j',
    ...(cookie ? ['-H', `cookie=${cookie}`] : []),
    url,
  ];
  const stdout = await new Promise<string>((resolve, reject) => {
    let buf = '';
    const child = spawn('npx', args, { stdio: ['ignore', 'pipe', 'ignore'] });
    child.stdout.on('data', (d) => (buf += d));
    child.on('exit', (code) => (code === 0 ? resolve(buf) : reject(new Error(`autocannon exited ${code}`))));
  });
  const r = JSON.parse(stdout);
  return { name, rps: r.requests.average, p99: r.latency.p99, p50: r.latency.p50, errors: r.errors, non2xx: r.non2xx };
}

if (import.meta.url === `file://${process.argv[1]}`) await main();

async function main() {
  const db = await openDatabase('loadline_bench', true);
  try {
    await migrate(db.ownerUrl, db.url);
    console.log('[bench] generating 1,000 athletes with a year of logs…');
    const gen = await generate(db.url, db.ownerUrl);
    const config = loadConfig({
      DATABASE_URL: db.url,
      SESSION_SECRET: 'bench-secret-bench-secret-bench-secret-42',
      PORT: '0',
      LOG_LEVEL: 'silent',
      SIGNIN_MAX_PER_IP: '1000',
    });
    const app = await startServer(config, createLogger('silent'));
    const pool = new pg.Pool({ connectionString: db.url, max: 20 });
    const bare = express();
    bare.get('/bare/:athleteId', async (req, res) => {
      const { rows } = await pool.query(
        'SELECT id, date, session_rpe, duration_minutes FROM training_logs WHERE athlete_id = $1 ORDER BY date DESC LIMIT 20',
        [req.params.athleteId],
      );
      res.json(rows);
    });
    const bareServer: Server = await new Promise((resolve) => {
      const s = bare.listen(0, '127.0.0.1', () => resolve(s));
    });
    const barePort = (bareServer.address() as { port: number }).port;
    const coachCookie = await signIn(app.url, 'coach@bench.example');
    const athleteCookie = await signIn(app.url, gen.athleteEmail);
    const connections = (process.env.BENCH_CONNECTIONS ?? '50,200').split(',').map(Number);
    const rows: string[] = [];
    for (const c of connections) {
      const results = [
        await autocannon('bare route (one indexed query)', c, `http://127.0.0.1:${barePort}/bare/${gen.athlete.id}`),
        await autocannon(`coach roster (${ROSTER} athletes)`, c, `${app.url}/api/orgs/${gen.org}/roster`, coachCookie),
        await autocannon("athlete's today view", c, `${app.url}/api/orgs/${gen.org}/athletes/${gen.athlete.id}/today`, athleteCookie),
      ];
      const [bareResult] = results;
      for (const r of results) {
        const rpsRatio = r.rps / bareResult.rps;
        const p99Ratio = r.p99 / bareResult.p99;
        const met = r === bareResult ? '' : rpsRatio >= 0.5 && p99Ratio <= 2 ? ' met' : ' not met';
        rows.push(
          `| ${c} | ${r.name} | ${r.rps.toFixed(0)} | ${r.p50} | ${r.p99} | ${rpsRatio.toFixed(2)} | ${p99Ratio.toFixed(2)}${met} | ${r.errors} / ${r.non2xx} |`,
        );
      }
    }
    console.log(
      '\n| connections | route | requests/s | p50 ms | p99 ms | req/s ÷ bare | p99 ÷ bare | errors / non-2xx |\n| --- | --- | --- | --- | --- | --- | --- | --- |',
    );
    for (const r of rows) console.log(r);
    await app.stop();
    await new Promise((r) => bareServer.close(r));
    await pool.end();
  } finally {
    db.cluster?.stop();
  }
}
