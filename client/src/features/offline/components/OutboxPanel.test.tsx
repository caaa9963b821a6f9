import { afterEach, describe, expect, it } from 'vitest';
import { fireEvent, render, screen, within } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { MembershipSummaryDto, UserDto } from '../../../../../policies/dto';
import { MembershipContext } from '../../../lib/membership-context';
import type { OutboxItem } from '../../../lib/offline-queue';
import { OutboxPanel } from './OutboxPanel';

const ORG = '11111111-1111-4111-8111-111111111111';
const user: UserDto = { id: 'u1', email: 'ines@x.test', displayName: 'Ines', unitPref: 'kg' };
const membership = {
  id: 'm1',
  organizationId: ORG,
  organizationName: 'Harbor Point',
  roles: ['athlete'],
} as unknown as MembershipSummaryDto;

const item = (over: Partial<OutboxItem>): OutboxItem => ({
  key: crypto.randomUUID(),
  orgId: ORG,
  kind: 'training_log',
  path: `/orgs/${ORG}/training-logs`,
  body: { date: '2026-12-04' },
  madeAt: '2026-12-04T17:05:00Z',
  state: 'waiting',
  ...over,
});

function renderPanel(items: OutboxItem[]) {
  localStorage.setItem(`loadline.outbox.${user.id}`, JSON.stringify(items));
  return render(
    <QueryClientProvider client={new QueryClient()}>
      <MembershipContext.Provider value={{ user, membership, orgId: ORG }}>
        <OutboxPanel />
      </MembershipContext.Provider>
    </QueryClientProvider>,
  );
}

afterEach(() => localStorage.clear());

describe('OutboxPanel', () => {
  it('marks each waiting entry with a drawn mark that has a spoken label (WCAG 2.2, 1.1.1), not a font glyph', () => {
    renderPanel([item({}), item({ kind: 'check_in' })]);
    const panel = screen.getByRole('region', { name: 'Kept on this phone' });
    expect(panel).toHaveTextContent('2 entries are waiting for signal.');
    const marks = within(panel).getAllByRole('img', { name: 'Waiting to be sent' });
    expect(marks).toHaveLength(2);
    expect(marks[0].tagName.toLowerCase()).toBe('svg');
    expect(panel).not.toHaveTextContent('⧗');
  });

  it('shows a refused entry with its reason and keeps it until the athlete discards it', () => {
    const refused = item({
      state: 'rejected',
      reason: 'The planned session it was logged against is no longer in your program: your coach may have moved or removed it.',
      refusedFields: ['sessionId'],
    });
    renderPanel([refused]);
    const alert = screen.getByRole('alert');
    expect(alert).toHaveTextContent('Not accepted: Session log of Fri 4 Dec 2026');
    expect(alert).toHaveTextContent('no longer in your program');
    expect(alert).toHaveTextContent('It stays here until you send it again or discard it.');
    expect(within(alert).getByRole('button', { name: 'Send as a session of its own' })).toBeInTheDocument();
    expect(within(alert).getByRole('button', { name: 'Send again' })).toBeInTheDocument();

    fireEvent.click(within(alert).getByRole('button', { name: 'Discard' }));
    expect(screen.queryByRole('region', { name: 'Kept on this phone' })).not.toBeInTheDocument();
    expect(localStorage.getItem(`loadline.outbox.${user.id}`)).toBeNull();
  });

  it('offers sending without the plan only when the refusal was about the planned session', () => {
    renderPanel([item({ state: 'rejected', reason: 'Too late.', refusedFields: ['date'] })]);
    expect(screen.queryByRole('button', { name: 'Send as a session of its own' })).not.toBeInTheDocument();
  });
});
