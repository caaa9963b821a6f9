import { describe, expect, it } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import type { PlanTemplateDto, PlanTemplateSummaryDto } from '../../../../../policies/dto';
import type { Role } from '../../../../../policies/roles';
import { ORG, fetchMock, renderAt, sessionFor, stubFetch } from '../../../test/app';
import { jsonResponse } from '../../../test/render';
import { STALE_TEMPLATE } from '../../../features/plan-templates/components/TemplateEditor';

/**
 * The plan templates' pages as each person sees them: the list (empty, filled, closed to a coach) and
 * one template, whose author edits it and anyone else copies it; the editor names the field a save
 * was refused for.
 */

stubFetch();

const ME = 'm-theo'; // the signed-in member in sessionFor
const summary = (over: Partial<PlanTemplateSummaryDto> = {}): PlanTemplateSummaryDto => ({
  id: 't-ankle',
  name: 'Lateral ankle sprain (two stages)',
  description: 'After a first sprain with no fracture found.',
  authorId: 'm-marcus',
  authorName: 'Marcus Bell, DPT',
  stageCount: 2,
  lengthDays: 28,
  canEdit: false,
  updatedAt: '2026-03-01T09:00:00.000Z',
  version: 3,
  ...over,
});
const full = (over: Partial<PlanTemplateDto> = {}): PlanTemplateDto => ({
  ...summary(),
  guidance: 'Walk as comfort allows.',
  stages: [
    { label: 'Protect', startOffset: 0, endOffset: 9, painCeiling: 2, patterns: { jump: { mode: 'blocked' } } },
    { label: 'Load and hop', startOffset: 10, endOffset: 27, painCeiling: 3, patterns: {} },
  ],
  ...over,
});

type Answer = { status: number; body: unknown };
/** Answers GETs by path and writes by "METHOD path"; anything else is a 404. */
function serveApi(roles: Role[], answers: Record<string, unknown | Answer>) {
  const all: Record<string, unknown> = { 'GET /session': sessionFor(roles), ...answers };
  fetchMock.mockImplementation(async (input, init) => {
    const path = String(input)
      .replace(/^\/api/, '')
      .split('?')[0];
    const key = `${init?.method ?? 'GET'} ${path}`;
    if (!(key in all)) return jsonResponse(404, { error: { code: 'not_found', message: `No ${key}` }, requestId: 'r' });
    const a = all[key];
    return a && typeof a === 'object' && 'status' in a && 'body' in a ? jsonResponse(a.status as number, a.body) : jsonResponse(200, a);
  });
}

const LIST = `GET /orgs/${ORG}/plan-templates`;
const ONE = `GET /orgs/${ORG}/plan-templates/t-ankle`;
const PUT = `PUT /orgs/${ORG}/plan-templates/t-ankle`;

describe('the plan templates list', () => {
  it('says there are none yet and where one comes from', async () => {
    serveApi(['clinician'], { [LIST]: [] });
    renderAt('/clinician/plan-templates');
    expect(await screen.findByText('No plan templates yet. Save a plan as a template from its case.')).toBeInTheDocument();
    expect(screen.queryByRole('list', { name: 'Templates' })).not.toBeInTheDocument();
  });

  it('lists each template with its author, version, stages and length, linked to its page', async () => {
    serveApi(['clinician'], {
      [LIST]: [summary(), summary({ id: 't-mine', name: 'Knee, patellar tendon', authorId: ME, authorName: 'Theo Lindqvist', version: 1 })],
    });
    renderAt('/clinician/plan-templates');
    const list = await screen.findByRole('list', { name: 'Templates' });
    const items = within(list).getAllByRole('listitem');
    expect(items).toHaveLength(2);
    expect(items[0]).toHaveTextContent('By Marcus Bell, DPT · version 3 · 2 stages, 28 days');
    expect(within(items[0]).getByRole('link', { name: 'Lateral ankle sprain (two stages)' })).toHaveAttribute(
      'href',
      '/clinician/plan-templates/t-ankle',
    );
    expect(items[1]).toHaveTextContent('By Theo Lindqvist · version 1');
  });

  it('an admin reaches the same list under the admin pages', async () => {
    serveApi(['admin'], { [LIST]: [summary()] });
    renderAt('/admin/plan-templates');
    const link = await screen.findByRole('link', { name: 'Lateral ankle sprain (two stages)' });
    expect(link).toHaveAttribute('href', '/admin/plan-templates/t-ankle');
  });
});

describe('one plan template', () => {
  it("someone else's: copy as my own, no edit or archive, and why", async () => {
    serveApi(['clinician'], { [ONE]: full() });
    renderAt('/clinician/plan-templates/t-ankle');
    expect(await screen.findByRole('heading', { level: 1, name: 'Plan template: Lateral ankle sprain (two stages)' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Copy as my own' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Edit template' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Archive' })).not.toBeInTheDocument();
    expect(screen.getByText('Only its author or an admin changes this template. A copy is yours to change.')).toBeInTheDocument();
    // Stages as days from the first day (day 1), not dates.
    expect(screen.getByText(/Days 11–28 \(18 days\)/)).toBeInTheDocument();
  });

  it('the author’s own: edit and archive, nothing to copy', async () => {
    serveApi(['clinician'], { [ONE]: full({ authorId: ME, canEdit: true }) });
    renderAt('/clinician/plan-templates/t-ankle');
    expect(await screen.findByRole('button', { name: 'Edit template' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Archive' })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Copy as my own' })).not.toBeInTheDocument();
  });

  it('the editor names the field the server refused and keeps what was typed', async () => {
    serveApi(['clinician'], {
      [ONE]: full({ authorId: ME, canEdit: true }),
      [PUT]: {
        status: 400,
        body: {
          error: {
            code: 'validation_failed',
            message: 'Please check the form.',
            fields: { name: ['is already used by another template'] },
          },
          requestId: 'r',
        },
      },
    });
    renderAt('/clinician/plan-templates/t-ankle');
    fireEvent.click(await screen.findByRole('button', { name: 'Edit template' }));
    const form = screen.getByRole('form', { name: 'Edit the plan template' });
    expect(within(form).getByText(/Editing version 3\./)).toBeInTheDocument();
    fireEvent.change(within(form).getByLabelText('Template name'), { target: { value: 'Ankle, first sprain' } });
    fireEvent.click(within(form).getByRole('button', { name: 'Save template' }));
    expect(await within(form).findByText('Template name is already used by another template')).toBeInTheDocument();
    expect(within(form).getByLabelText('Template name')).toHaveAttribute('aria-invalid', 'true');
    expect(within(form).getByLabelText('Template name')).toHaveValue('Ankle, first sprain');
  });

  it('the editor refuses a stage that ends before it starts, beside the field, before sending anything', async () => {
    serveApi(['clinician'], { [ONE]: full({ authorId: ME, canEdit: true }) });
    renderAt('/clinician/plan-templates/t-ankle');
    fireEvent.click(await screen.findByRole('button', { name: 'Edit template' }));
    // Stage 2 ends on the day stage 1 starts, ten days before its own start.
    const firstDay = (within(screen.getByRole('group', { name: 'Stage 1' })).getByLabelText('Start date') as HTMLInputElement).value;
    const stage2 = screen.getByRole('group', { name: 'Stage 2' });
    fireEvent.change(within(stage2).getByLabelText('End date'), { target: { value: firstDay } });
    fireEvent.click(screen.getByRole('button', { name: 'Save template' }));
    expect(await screen.findByText('Some stage fields need fixing: each is marked beside the field.')).toBeInTheDocument();
    await waitFor(() => expect(within(stage2).getByLabelText('End date')).toHaveAttribute('aria-invalid', 'true'));
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'PUT')).toBe(false);
  });

  it('a save refused because someone saved first says so, and reopens the editor on the latest version', async () => {
    let version = 3;
    serveApi(['clinician'], {
      [PUT]: { status: 409, body: { error: { code: 'version_conflict', message: 'Changed since.' }, requestId: 'r' } },
    });
    const answer = fetchMock.getMockImplementation()!;
    fetchMock.mockImplementation(async (input, init) =>
      `${init?.method ?? 'GET'} ${String(input).replace(/^\/api/, '')}` === ONE
        ? jsonResponse(200, full({ authorId: ME, canEdit: true, version }))
        : answer(input, init),
    );
    renderAt('/clinician/plan-templates/t-ankle');
    fireEvent.click(await screen.findByRole('button', { name: 'Edit template' }));
    version = 4;
    fireEvent.click(screen.getByRole('button', { name: 'Save template' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Template not saved');
    expect(alert).toHaveTextContent(STALE_TEMPLATE);
    expect(screen.getByRole('button', { name: 'Save template' })).toBeDisabled();
    fireEvent.click(within(alert).getByRole('button', { name: 'Load the latest version' }));
    expect(await screen.findByText(/Editing version 4\./)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Save template' })).toBeEnabled();
  });

  it('a coach is told templates are not for them', async () => {
    serveApi(['coach'], { [LIST]: [summary()] });
    renderAt('/clinician/plan-templates');
    expect(await screen.findByRole('alert')).toHaveTextContent("You can't do that");
    // Nothing is asked for that the server would refuse anyway.
    expect(fetchMock.mock.calls.some(([input]) => String(input).includes('/plan-templates'))).toBe(false);
  });
});
