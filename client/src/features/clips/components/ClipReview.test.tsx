import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, within } from '@testing-library/react';
import { AbilityProvider } from '@casl/react';
import { defineAbilityFor, type Actor } from '../../../../../policies/access';
import type { ClipDto } from '../../../../../policies/dto';
import { renderWithProviders } from '../../../test/render';
import { ClipReview } from './ClipReview';
import { notesInClipOrder } from './ClipNotes';

const ORG = '11111111-1111-4111-8111-111111111111';
const ATHLETE = '22222222-2222-4222-8222-222222222222';

const note = (id: string, atMs: number, body: string, createdAt = '2026-12-01T10:00:00.000Z') => ({
  id,
  clipId: 'c1',
  atMs,
  body,
  authorName: 'Theo Lindqvist',
  authorUserId: 'u-theo',
  authorRole: 'coach' as const,
  createdAt,
});

const clip: ClipDto = {
  id: 'c1',
  athleteId: ATHLETE,
  athleteName: 'Maya Torres',
  trainingLogId: 'l1',
  sessionDate: '2026-12-01',
  exercise: 'Back squat',
  caption: null,
  mediaType: 'video/webm',
  sizeBytes: 1000,
  uploadedByName: 'Maya Torres',
  uploadedByUserId: 'u-maya',
  uploadedAt: '2026-12-01T10:00:00.000Z',
  videoPath: `/orgs/${ORG}/clips/c1/video`,
  noteCount: 2,
  notes: [note('n2', 2400, 'Heels lift here.'), note('n1', 1500, 'Knees drift in on the way up.')],
};

function renderAs(actor: Actor) {
  return renderWithProviders(
    <AbilityProvider value={defineAbilityFor(actor)}>
      <ClipReview orgId={ORG} clip={clip} />
    </AbilityProvider>,
  );
}

const athlete: Actor = {
  userId: 'u-maya',
  organizationId: ORG,
  membershipId: ATHLETE,
  roles: ['athlete'],
  coachOf: [],
  clinicianOf: [],
  guardianOf: [],
};
const coach: Actor = {
  userId: 'u-theo',
  organizationId: ORG,
  membershipId: 'm-theo',
  roles: ['coach'],
  coachOf: [ATHLETE],
  clinicianOf: [],
  guardianOf: [],
};

let pause: ReturnType<typeof vi.spyOn>;
beforeEach(() => {
  pause = vi.spyOn(HTMLMediaElement.prototype, 'pause').mockImplementation(() => {});
});
afterEach(() => vi.restoreAllMocks());

describe('notesInClipOrder', () => {
  it('orders by the moment in the clip, then by when written', () => {
    const ordered = notesInClipOrder([
      note('b', 900, 'b', '2026-12-01T11:00:00Z'),
      note('c', 100, 'c'),
      note('a', 900, 'a', '2026-12-01T10:00:00Z'),
    ]);
    expect(ordered.map((n) => n.id)).toEqual(['c', 'a', 'b']);
  });
});

describe('ClipReview', () => {
  it('lists notes by time with mm:ss.s and author, and choosing one pauses the video at its moment', () => {
    const { container } = renderAs(athlete);
    const video = container.querySelector('video')!;
    expect(video.hasAttribute('controls')).toBe(false);
    expect(video.getAttribute('src')).toBe(`/api/orgs/${ORG}/clips/c1/video`);

    const list = screen.getByRole('heading', { name: /Notes/ }).closest('section')!;
    const items = within(list).getAllByRole('button', { name: /^At / });
    expect(items.map((b) => b.textContent)).toEqual([
      expect.stringContaining('00:01.5Theo Lindqvist · coach'),
      expect.stringContaining('00:02.4Theo Lindqvist · coach'),
    ]);

    fireEvent.click(screen.getByRole('button', { name: 'At 1.5 seconds, Theo Lindqvist: Knees drift in on the way up.' }));
    expect(pause).toHaveBeenCalled();
    expect(video.currentTime).toBeCloseTo(1.5, 3);
    expect(screen.getByTestId('clip-clock')).toHaveTextContent('00:01.5');
    // The athlete reads notes but does not write them.
    expect(screen.queryByRole('form', { name: 'Pin a note' })).toBeNull();
  });

  it('gives staff a note form that says the time the note will be pinned at, following frame steps', () => {
    renderAs(coach);
    const form = screen.getByRole('form', { name: 'Pin a note' });
    expect(within(form).getByTestId('note-pin-time')).toHaveTextContent('00:00.0');
    fireEvent.change(screen.getByLabelText('Go to (seconds, or m:ss.s)'), { target: { value: '1.4' } });
    fireEvent.click(screen.getByRole('button', { name: 'Go' }));
    for (let i = 0; i < 3; i += 1) fireEvent.click(screen.getByRole('button', { name: 'Forward one frame' }));
    expect(within(form).getByTestId('note-pin-time')).toHaveTextContent('00:01.5');
    expect(within(form).getByRole('button', { name: 'Pin note at 00:01.5' })).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Forward one frame' })).toHaveAttribute('title', expect.stringMatching(/1\/30/));
  });
});

describe('a WebM clip without its length in the header', () => {
  it('seeks far ahead once to learn the length, then goes back; a note chosen meanwhile wins over the start', () => {
    const { container } = renderAs(athlete);
    const video = container.querySelector('video')!;
    let duration = Number.POSITIVE_INFINITY;
    Object.defineProperty(video, 'duration', { configurable: true, get: () => duration });
    Object.defineProperty(video, 'readyState', { configurable: true, get: () => HTMLMediaElement.HAVE_METADATA });

    fireEvent(video, new Event('loadedmetadata'));
    expect(video.currentTime).toBeGreaterThan(1000);
    expect(screen.getByText(/measuring/)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Play' })).toBeDisabled();

    fireEvent.click(screen.getByRole('button', { name: 'At 2.4 seconds, Theo Lindqvist: Heels lift here.' }));
    duration = 3.5;
    fireEvent(video, new Event('durationchange'));
    expect(video.currentTime).toBeCloseTo(2.4, 3);
    expect(screen.getByText('/ 00:03.5')).toBeInTheDocument();
    expect(screen.getByRole('slider', { name: 'Position in the clip' })).toBeEnabled();
    expect(screen.getByRole('button', { name: 'Play' })).toBeEnabled();
  });

  it('reads the length straight away when the header has it', () => {
    const { container } = renderAs(athlete);
    const video = container.querySelector('video')!;
    Object.defineProperty(video, 'duration', { configurable: true, get: () => 4.25 });
    fireEvent(video, new Event('loadedmetadata'));
    expect(video.currentTime).toBe(0);
    expect(screen.getByText('/ 00:04.2')).toBeInTheDocument();
  });
});
