import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { useHarness } from '../../test/harness';
import { binary, pdfText } from '../../test/worlds/letter-fixtures';
import { addDays, pinClock, put, TODAY } from '../../test/worlds/test-world';
import { MONDAY, teamWorld } from '../../test/worlds/team-world';

/**
 * The floor sheet a coach tapes to the rack for a team session, as PDF and CSV. The squad of
 * team-world.ts: back squat and deadlift 3 × 5 @ 75 % of 1RM (100 kg and 140 kg), four sprints; the
 * hinge athlete capped at 60 % (deadlift fitted down to 82.5 kg), the sprint athlete blocked (sprints
 * dropped), one Out.
 */
describe('team programs: the floor sheet', () => {
  const h = useHarness({ SIGNIN_MAX_PER_IP: '1000' });
  pinClock();

  async function world() {
    const w = await teamWorld(h);
    const p = await w.createProgram();
    const team = await w.addSession(p.id);
    const rows: { id: string; name: string }[] = await h.ds.query(
      `SELECT ms.id, u.display_name AS name FROM memberships ms JOIN users u ON u.id = ms.user_id WHERE ms.id = ANY($1)`,
      [w.athletes],
    );
    const name = (id: string) => rows.find((r) => r.id === id)!.name;
    const pdfUrl = `${w.base}/team-sessions/${team.id}/floor-sheet.pdf`;
    const csvUrl = `${w.base}/team-sessions/${team.id}/floor-sheet.csv`;
    return { ...w, p, team, name, pdfUrl, csvUrl };
  }

  /** The CSV's records (csv-stringify's quoting undone: "" inside quotes, commas and line breaks inside quotes). */
  function parseCsv(text: string): string[][] {
    const records: string[][] = [];
    let field = '';
    let record: string[] = [];
    let quoted = false;
    const s = text.replace(/^\uFEFF/, '');
    const endField = () => {
      record.push(field);
      field = '';
    };
    for (let i = 0; i < s.length; i++) {
      const ch = s[i];
      if (quoted) {
        if (ch === '"' && s[i + 1] === '"') {
          field += '"';
          i++;
        } else if (ch === '"') quoted = false;
        else field += ch;
      } else if (ch === '"') quoted = true;
      else if (ch === ',') endField();
      else if (ch === '\n') {
        endField();
        records.push(record);
        record = [];
      } else if (ch !== '\r') field += ch;
    }
    if (field || record.length) {
      endField();
      records.push(record);
    }
    return records;
  }

  it("prints one row per athlete with their own loads, plates per side, the fitted mark, in each athlete's unit; audited", async () => {
    const w = await world();
    // The plain athlete reads pounds: 75 kg = 165.35 lb (NIST SP 811), 45 lb bar, (165.35 − 45) / 2 = 60.17 lb a side → 60 lb in the fewest plates, 35 + 25 (plates.ts).
    await h.ds.query(`UPDATE users SET unit_pref = 'lb' WHERE id = $1`, [w.plainAthlete.userId]);
    const res = await binary(w.coach.get(w.pdfUrl));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="floor-sheet-${MONDAY}-squad-lift.pdf"`);
    expect(res.headers['cache-control']).toBe('no-store');
    const text = await pdfText(res.body as Buffer);
    expect(text).toContain('Floor sheet — Squad lift');
    expect(text).toContain('Infield · Infield strength · Mon 7 Dec 2026');
    expect(text).toContain('Not published yet');
    expect(text).toContain('Marked rows were fitted');
    expect(text).toMatch(/licensed clinician/);
    for (const a of w.athletes) expect(text).toContain(w.name(a));

    // As written: 75 % of 100 kg and of 140 kg → 75 kg and 105 kg; 27.5 kg a side = 25 + 2.5; 42.5 kg a side = 25 + 15 + 2.5.
    const asWritten = w.athletes.find((a) => a !== w.hinge && a !== w.sprint && a !== w.out && a !== w.plainAthlete.membershipId)!;
    expect(text).toContain(
      `${w.name(asWritten)} Loads in kg As written Back squat: 3 sets of 75 kg × 5 at RPE 7 Plates — 75 kg: 25 + 2.5 kg a side Deadlift: 3 sets of 105 kg × 5 at RPE 7 Plates — 105 kg: 25 + 15 + 2.5 kg a side`,
    );
    // Fitted: the hinge cap of 60 % of 140 kg (84 kg) → 82.5 kg on 2.5 kg steps; 31.25 kg a side = 25 + 5 + 1.25.
    expect(text).toContain(`${w.name(w.hinge)} Loads in kg Fitted`);
    expect(text).toContain('Deadlift: 3 sets of 82.5 kg × 5 at RPE 7 Plates — 82.5 kg: 25 + 5 + 1.25 kg a side');
    expect(text).toContain(`${w.name(w.sprint)} Loads in kg Needs a decision`);
    expect(text).toMatch(/Dropped: Sprint 20 m, 4 sets \(/);
    expect(text).toContain(`${w.name(w.out)} Loads in kg Out`);
    expect(text).toContain('Out on this date: nothing planned.');
    expect(text).toContain(`${w.name(w.plainAthlete.membershipId)} Loads in lb As written Back squat: 3 sets of 165.35 lb × 5`);
    expect(text).toContain('165.35 lb: 35 + 25 lb a side (makes 165 lb)');

    const audit = await w.audit('floor_sheet.downloaded', w.team.id);
    expect(audit).toHaveLength(1);
    expect(audit[0].after).toEqual({ format: 'pdf', date: MONDAY, athletes: 8 });
  });

  it('the CSV holds the same rows: one record per athlete and exercise, the fitted flag, the note once', async () => {
    const w = await world();
    const res = await w.coach.get(w.csvUrl);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="floor-sheet-${MONDAY}-squad-lift.csv"`);
    expect(res.headers['cache-control']).toBe('no-store');
    const [header, ...records] = parseCsv(res.text);
    expect(header).toEqual(['athlete', 'state', 'fitted', 'unit', 'exercise', 'sets', 'plates_per_side', 'note']);
    // Six athletes with three rows, the sprint athlete with two (the sprints were dropped), one Out with none.
    expect(records).toHaveLength(6 * 3 + 2 + 1);
    expect(new Set(records.map((r) => r[0]))).toEqual(new Set(w.athletes.map(w.name)));
    const of = (id: string) => records.filter((r) => r[0] === w.name(id));
    expect(of(w.hinge)).toEqual([
      [w.name(w.hinge), 'Fitted', 'yes', 'kg', 'Back squat', '3 sets of 75 kg × 5 at RPE 7', '75 kg: 25 + 2.5 kg a side', ''],
      [w.name(w.hinge), 'Fitted', 'yes', 'kg', 'Deadlift', '3 sets of 82.5 kg × 5 at RPE 7', '82.5 kg: 25 + 5 + 1.25 kg a side', ''],
      [w.name(w.hinge), 'Fitted', 'yes', 'kg', 'Sprint 20 m', '4 sets of body weight × 1 at RPE 8', '', ''],
    ]);
    expect(of(w.out)).toEqual([[w.name(w.out), 'Out', '', 'kg', '', '', '', 'Out on this date: nothing planned.']]);
    const sprint = of(w.sprint);
    expect(sprint.map((r) => r.slice(1, 3))).toEqual([
      ['Needs a decision', 'yes'],
      ['Needs a decision', 'yes'],
    ]);
    expect(sprint[0][7]).toMatch(/^Dropped: Sprint 20 m, 4 sets \(.*blocked/);
    expect(sprint[1][7]).toBe('');
    expect((await w.audit('floor_sheet.downloaded', w.team.id))[0].after).toMatchObject({ format: 'csv' });
  });

  it('a name a spreadsheet would run as a formula is neutralised (OWASP CSV Injection)', async () => {
    const w = await world();
    await h.ds.query(`UPDATE users SET display_name = $1 WHERE id = $2`, ['=HYPERLINK("http://evil.example","x")', w.plainAthlete.userId]);
    await h.ds.query(`UPDATE users SET display_name = $1 WHERE id = (SELECT user_id FROM memberships WHERE id = $2)`, ['@SUM(1+1)', w.out]);
    const records = parseCsv((await w.coach.get(w.csvUrl)).text);
    const cells = records.flat();
    expect(cells).toContain(`'=HYPERLINK("http://evil.example","x")`);
    expect(cells).toContain(`'@SUM(1+1)`);
    expect(cells.some((c) => /^[=+\-@\t\r]/.test(c))).toBe(false);
  });

  it("the group's clinicians read it; another coach and an athlete are told it was not found", async () => {
    const w = await world();
    // The clinician is on the care team of the sprint and Out athletes (team-world.ts).
    expect((await binary(w.clinician.get(w.pdfUrl))).status).toBe(200);
    const other = await w.as(w.org.otherCoach);
    for (const url of [w.pdfUrl, w.csvUrl]) {
      const res = await other.get(url);
      expect(res.status).toBe(404);
      expect(res.headers['content-disposition']).toBeUndefined();
    }
    // An athlete's own version is not a team session: it has no floor sheet.
    const versionId = w.cell(await w.grid(w.p.id), w.hinge).versionId!;
    expect((await w.coach.get(`${w.base}/team-sessions/${versionId}/floor-sheet.pdf`)).status).toBe(404);
    const athlete = await w.as(w.org.athlete);
    expect((await athlete.get(w.pdfUrl)).status).toBe(404);
    expect((await athlete.get(w.csvUrl)).status).toBe(404);
    // Only the clinician's download was recorded.
    expect(await w.audit('floor_sheet.downloaded', w.team.id)).toHaveLength(1);
  });

  it('after a limit change, a published row on hold prints no loads, only what to do', async () => {
    const w = await world();
    await w.versionAction(w.team.id, w.sprint, 'accept', (await w.version(w.team.id, w.sprint)).version.version);
    expect((await w.publish(w.p.id, [w.team.id])).status).toBe(200);
    const stage = {
      id: randomUUID(),
      startDate: addDays(TODAY, -30),
      endDate: addDays(TODAY, 120),
      painCeiling: 5,
      patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 50 } } },
    };
    const revised = await put(w.clinician, `${w.base}/plans/${w.hingePlan.planId}`, { version: 1, stages: [stage], guidance: '' });
    expect(revised.status, JSON.stringify(revised.body)).toBe(200);
    const text = await pdfText((await binary(w.coach.get(w.pdfUrl))).body as Buffer);
    expect(text).not.toContain('Not published yet');
    // The held version (82.5 kg, over the new 50 % cap of 70 kg) shows no sets at all.
    expect(text).toContain(`${w.name(w.hinge)} Loads in kg Fitted On hold: the limits changed after this was published.`);
    expect(text).not.toContain('82.5 kg');
    const records = parseCsv((await w.coach.get(w.csvUrl)).text).filter((r) => r[0] === w.name(w.hinge));
    expect(records).toEqual([[w.name(w.hinge), 'Fitted', 'yes', 'kg', '', '', '', expect.stringMatching(/^On hold: /)]]);
  });

  it("prints landscape on the organization's paper: A4, or US Letter when it chose Letter", async () => {
    const w = await world();
    const view = async () => {
      const doc = await getDocument({ data: new Uint8Array((await binary(w.coach.get(w.pdfUrl))).body as Buffer), isEvalSupported: false })
        .promise;
      const v = (await doc.getPage(1)).view.map((x) => Math.round(x * 100) / 100);
      await doc.destroy();
      return v;
    };
    // ISO 216 A4 is 841.89 × 595.28 pt landscape; ANSI Letter 792 × 612 pt (the test organization's zone is UTC: A4).
    expect(await view()).toEqual([0, 0, 841.89, 595.28]);
    await h.ds.query(`UPDATE organizations SET letter_paper = 'letter' WHERE id = $1`, [w.org.id]);
    expect(await view()).toEqual([0, 0, 792, 612]);
  });

  it('pages break with the header repeated on each page', async () => {
    const w = await world();
    // Many exercises make each row tall enough that eight athletes need more than one page.
    const content = w.squadContent();
    const squat = content.exercises[0];
    const many = {
      exercises: [...Array(8)].map(() => ({
        ...squat,
        id: randomUUID(),
        sets: squat.sets.map((s) => ({ ...s, id: randomUUID() })),
      })),
    };
    const tall = await w.addSession(w.p.id, many, MONDAY);
    const res = await binary(w.coach.get(`${w.base}/team-sessions/${tall.id}/floor-sheet.pdf`));
    expect(res.status).toBe(200);
    const text = await pdfText(res.body as Buffer);
    const pages = text.match(/Floor sheet — Squad lift/g) ?? [];
    expect(pages.length).toBeGreaterThan(1);
    expect(text).toContain(`page ${pages.length} of ${pages.length}`);
    for (const a of w.athletes) expect(text).toContain(w.name(a));
  });
});
