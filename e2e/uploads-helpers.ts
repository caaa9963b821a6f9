import { expect, type APIRequestContext, type Browser, type BrowserContextOptions, type Page } from '@playwright/test';
import type { SessionDto } from '../policies/dto';
import { DEMO, NEW_PASSWORD, signIn } from './helpers';

/**
 * Setup for the uploads spec through the API, so the spec owns its people and records: Dana (the
 * demo admin) invites a new athlete, coach, clinician and guardian, puts the two staff on the
 * athlete's care team and links the guardian; the athlete logs one session and the clinician opens a case. Nothing another spec reads is
 * touched. Each write carries the session's CSRF token, as the app's own client does.
 */

async function csrf(request: APIRequestContext): Promise<string> {
  const res = await request.get('/api/session');
  expect(res.ok(), 'GET /api/session').toBe(true);
  return ((await res.json()) as SessionDto).csrfToken;
}

export async function apiWrite<T>(request: APIRequestContext, method: 'post' | 'patch', path: string, data: unknown): Promise<T> {
  const token = await csrf(request);
  const res = await request[method](`/api${path}`, { data, headers: { 'X-CSRF-Token': token } });
  expect(res.ok(), `${method.toUpperCase()} ${path} → ${res.status()} ${await res.text()}`).toBe(true);
  return (await res.json()) as T;
}

export interface Person {
  page: Page;
  name: string;
  membershipId: string;
}

export interface UploadsCast {
  orgId: string;
  admin: Page;
  athlete: Person;
  coach: Person;
  clinician: Person;
  guardian: Person;
  caseId: string;
  logId: string;
}

/** Accepts an invitation in a fresh context with the given browser settings; the context is then signed in. */
async function join(browser: Browser, options: BrowserContextOptions, link: string, name: string): Promise<Person> {
  const context = await browser.newContext(options);
  const page = await context.newPage();
  const token = link.split('#')[1];
  const session = await apiWrite<SessionDto>(page.request, 'post', '/invitations/accept', {
    token,
    displayName: name,
    password: NEW_PASSWORD,
  });
  return { page, name, membershipId: session.memberships[0].id };
}

export async function castForUploads(
  browser: Browser,
  options: { desktop: BrowserContextOptions; phone: BrowserContextOptions },
  stamp: string,
  today: string,
): Promise<UploadsCast> {
  const admin = await (await browser.newContext(options.desktop)).newPage();
  await signIn(admin, DEMO.admin.email);
  const session = (await (await admin.request.get('/api/session')).json()) as SessionDto;
  const orgId = session.memberships[0].organizationId;

  const invite = async (label: string, roles: string[], extra: Record<string, string> = {}) => {
    const inv = await apiWrite<{ link: string }>(admin.request, 'post', `/orgs/${orgId}/invitations`, {
      email: `e2e-uploads-${label}-${stamp}@harborpoint.example`,
      roles,
      ...extra,
    });
    return inv.link;
  };
  const athleteName = `Clip Athlete ${stamp}`;
  const athlete = await join(browser, options.phone, await invite('athlete', ['athlete'], { dateOfBirth: '2005-04-02' }), athleteName);
  const coach = await join(browser, options.desktop, await invite('coach', ['coach']), `Clip Coach ${stamp}`);
  const clinician = await join(browser, options.desktop, await invite('clinician', ['clinician']), `Clip Clinician ${stamp}`);
  const guardian = await join(browser, options.phone, await invite('guardian', ['guardian']), `Clip Guardian ${stamp}`);
  await apiWrite(admin.request, 'post', `/orgs/${orgId}/guardian-links`, {
    athleteId: athlete.membershipId,
    guardianId: guardian.membershipId,
  });

  for (const [member, role] of [
    [coach, 'coach'],
    [clinician, 'clinician'],
  ] as const) {
    await apiWrite(admin.request, 'post', `/orgs/${orgId}/care-team`, {
      athleteId: athlete.membershipId,
      memberId: member.membershipId,
      role,
    });
  }
  const logged = await apiWrite<{ log: { id: string } }>(athlete.page.request, 'post', `/orgs/${orgId}/training-logs`, {
    athleteId: athlete.membershipId,
    date: today,
    durationMinutes: 45,
    sessionRpe: 6,
    painBefore: 1,
    painDuring: 2,
    sets: [
      { exercise: 'Goblet squat', loadKg: 20, reps: 8 },
      { exercise: 'Romanian deadlift', loadKg: 40, reps: 8 },
    ],
  });
  const opened = await apiWrite<{ id: string }>(clinician.page.request, 'post', `/orgs/${orgId}/cases`, {
    athleteId: athlete.membershipId,
    bodyRegions: ['lower_back'],
    onsetDate: today,
    status: 'limited',
    statusEffectiveFrom: today,
  });
  return { orgId, admin, athlete, coach, clinician, guardian, caseId: opened.id, logId: logged.log.id };
}

/**
 * Records a clip in the page itself: frames drawn on a canvas, captured at 30 fps by the browser's
 * own MediaRecorder as WebM (whose header carries no length, as from a phone browser). Returns the bytes.
 */
export async function recordWebmClip(page: Page, milliseconds: number): Promise<Buffer> {
  const base64 = await page.evaluate(async (ms) => {
    const canvas = document.createElement('canvas');
    canvas.width = 320;
    canvas.height = 240;
    const ctx = canvas.getContext('2d')!;
    let frame = 0;
    const draw = () => {
      ctx.fillStyle = '#f7f3ec';
      ctx.fillRect(0, 0, 320, 240);
      ctx.fillStyle = '#c2571a';
      ctx.fillRect((frame * 4) % 280, 120, 40, 40);
      ctx.fillStyle = '#14202e';
      ctx.font = '28px sans-serif';
      ctx.fillText(`frame ${frame}`, 16, 48);
      frame += 1;
    };
    draw();
    const stream = canvas.captureStream(30);
    const recorder = new MediaRecorder(stream, { mimeType: 'video/webm' });
    const chunks: Blob[] = [];
    recorder.ondataavailable = (e) => {
      if (e.data.size > 0) chunks.push(e.data);
    };
    const stopped = new Promise((resolve) => {
      recorder.onstop = resolve;
    });
    const timer = setInterval(draw, 1000 / 30);
    recorder.start(250);
    await new Promise((resolve) => setTimeout(resolve, ms));
    recorder.stop();
    clearInterval(timer);
    await stopped;
    const bytes = new Uint8Array(await new Blob(chunks, { type: 'video/webm' }).arrayBuffer());
    let binary = '';
    for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
    return btoa(binary);
  }, milliseconds);
  return Buffer.from(base64, 'base64');
}

/** The smallest well-formed one-page PDF: enough for the server's signature check. */
export function tinyPdf(): Buffer {
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] >>',
  ];
  let body = '%PDF-1.4\n';
  const offsets: number[] = [];
  objects.forEach((obj, i) => {
    offsets.push(body.length);
    body += `${i + 1} 0 obj\n${obj}\nendobj\n`;
  });
  const xref = body.length;
  body += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
  for (const offset of offsets) body += `${String(offset).padStart(10, '0')} 00000 n \n`;
  body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(body, 'latin1');
}

/** The player's video element's position, in seconds. */
export function videoTime(page: Page): Promise<number> {
  return page.locator('video').evaluate((v: HTMLVideoElement) => v.currentTime);
}
