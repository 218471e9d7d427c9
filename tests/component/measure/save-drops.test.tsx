import { act, render, renderHook, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it } from 'vitest';
import { photoBadge } from '@/components/measure/photo-table';
import { useWorkspace, type WorkspacePhoto } from '@/components/measure/store';
import { SessionPanel } from '@/components/measure/session-panel';
import { initialSession } from '@/components/measure/types';
import {
  BUSY_ATTEMPTS,
  SAVES_AT_ONCE,
  busyWaitMs,
  useSaveDrops,
} from '@/components/measure/use-save-drops';
import { COMPUTE_JOBS_PER_USER } from '@/lib/contracts/limits';
import { errorBody, stubFetch } from '../support';

const LIQUIDS = [
  { id: 'liquid-diiodomethane', name: 'Diiodomethane', hazardNote: 'Harmful.' },
  { id: 'liquid-water', name: 'Water', hazardNote: null },
];

const analysed = (id: string, name: string, sampleId = 'sample-1'): WorkspacePhoto => ({
  id,
  name,
  width: 640,
  height: 480,
  status: 'ready',
  error: null,
  result: null,
  method: 'circle',
  baseline: null,
  sampleId,
  probeLiquidId: 'liquid-water',
  dropId: null,
  savedRevision: null,
  dirty: true,
});

const SESSION_CREATED = {
  status: 201,
  body: {
    measurementSession: {
      id: 's1',
      organizationId: 'org-kestrel',
      version: 1,
      archivedAt: null,
      createdAt: '2026-03-02T09:00:00.000Z',
      updatedAt: '2026-03-02T09:00:00.000Z',
      operatorName: 'Analyst',
      measuredAt: '2026-03-02T09:00:00.000Z',
      probeLiquidId: 'liquid-water',
      temperatureC: null,
      humidityPct: null,
      dropVolumeUl: null,
      scalePxPerMm: null,
      instrumentNotes: '',
      liquidLot: 'W-LOT-0915',
      createdByUserId: 'user-analyst',
    },
  },
};

function setup(liquidLot = '') {
  let reloads = 0;
  const created: string[] = [];
  const waits: number[] = [];
  const hook = renderHook(() =>
    useSaveDrops({
      session: { ...initialSession(LIQUIDS, 'Ana Analyst'), liquidLot },
      onSessionCreated: (id) => created.push(id),
      onSaved: async () => {
        reloads += 1;
      },
      // Records the waits instead of waiting them.
      wait: async (ms) => {
        waits.push(ms);
      },
    }),
  );
  return { hook, created, reloads: () => reloads, waits };
}

const BUSY = {
  status: 429,
  headers: { 'retry-after': '5' },
  body: errorBody(
    'busy',
    'You already have 4 calculations running. Wait for one to finish, then try again.',
  ),
};

/** Every save-state step each photo went through, in order (repeats folded). */
function recordSaveSteps() {
  const steps = new Map<string, string[]>();
  const unsubscribe = useWorkspace.subscribe((state) => {
    for (const p of state.photos) {
      const step = p.saveState?.step ?? (p.savedRevision !== null ? 'saved' : 'none');
      const seen = steps.get(p.id) ?? [];
      if (seen.at(-1) !== step) steps.set(p.id, [...seen, step]);
    }
  });
  return { steps, unsubscribe };
}

beforeEach(() => {
  useWorkspace.setState({
    photos: [
      analysed('p1', 'a.png'),
      analysed('p2', 'b.png'),
      { ...analysed('p3', 'c.png'), dirty: false, savedRevision: 1, dropId: 'd3' },
    ],
  });
});

describe('saving drops', () => {
  it('starts with water as the probe liquid when the library has it', () => {
    expect(initialSession(LIQUIDS, 'Ana Analyst').probeLiquidId).toBe('liquid-water');
  });

  it('sends the liquid lot typed with the session conditions, for the certificate', async () => {
    const calls = stubFetch(({ url }) =>
      url === '/api/measurement-sessions'
        ? SESSION_CREATED
        : { status: 201, body: { revision: 1 } },
    );
    const { hook } = setup(' W-LOT-0915 ');
    await act(() => hook.result.current.saveMany(useWorkspace.getState().photos.slice(0, 2)));
    await waitFor(() => expect(hook.result.current.saving).toBe(false));
    expect(calls[0].url).toBe('/api/measurement-sessions');
    expect(calls[0].body).toMatchObject({ liquidLot: 'W-LOT-0915', operatorName: 'Ana Analyst' });
  });

  it('the session panel has a liquid-lot field beside the conditions', async () => {
    let value = { ...initialSession(LIQUIDS, 'Ana Analyst') };
    render(
      <SessionPanel
        value={value}
        onChange={(next) => (value = next)}
        onCalibrate={() => undefined}
        picked={null}
        onCalibrated={() => undefined}
      />,
    );
    const field = screen.getByLabelText(/Liquid lot/);
    await userEvent.type(field, 'D');
    expect(value.liquidLot).toBe('D');
  });

  it('asks for a sample before sending anything', async () => {
    const calls = stubFetch(() => ({ body: {} }));
    const { hook } = setup();
    await act(() =>
      hook.result.current.saveMany([analysed('p1', 'a.png'), analysed('p2', 'b.png', '')]),
    );
    expect(hook.result.current.message).toEqual({
      kind: 'error',
      text: 'Choose the sample b.png was placed on, then save.',
    });
    expect(calls).toHaveLength(0);
  });

  it('asks why a saved drop is analysed again, and sends the reason with it', async () => {
    const calls = stubFetch(({ url }) =>
      url === '/api/measurement-sessions'
        ? SESSION_CREATED
        : { status: 201, body: { revision: 2, dropId: 'd3' } },
    );
    const { hook } = setup();
    const p3 = useWorkspace.getState().photos[2];
    await act(() => hook.result.current.saveOne(p3));
    expect(hook.result.current.message).toEqual({
      kind: 'error',
      text: 'c.png is saved already: say why it is analysed again.',
    });
    expect(calls).toHaveLength(0);
    await act(() => hook.result.current.saveOne(p3, '  baseline on the contact points '));
    expect(calls[1].body).toMatchObject({ reason: 'baseline on the contact points' });
    expect(useWorkspace.getState().photos[2].savedRevision).toBe(2);
  });

  it('creates the session once, saves every unsaved photo and names the ones that failed', async () => {
    const calls = stubFetch(({ url }) => {
      if (url === '/api/measurement-sessions') return SESSION_CREATED;
      if (url === '/api/photos/p1/drop') return { status: 201, body: { revision: 1 } };
      return {
        status: 422,
        body: errorBody(
          'no_drop_found',
          'No drop was found. Choose another photo, then save again.',
        ),
      };
    });
    const { hook, created, reloads } = setup();
    await act(() => hook.result.current.saveMany(useWorkspace.getState().photos.slice(0, 2)));
    await waitFor(() => expect(hook.result.current.saving).toBe(false));
    expect(calls.map((c) => c.url)).toEqual([
      '/api/measurement-sessions',
      '/api/photos/p1/drop',
      '/api/photos/p2/drop',
    ]);
    expect(calls[1].body).toMatchObject({
      sampleId: 'sample-1',
      probeLiquidId: 'liquid-water',
      sessionId: 's1',
      method: 'circle',
      expectedRevision: 0,
    });
    expect(created).toEqual(['s1']);
    expect(hook.result.current.message).toEqual({
      kind: 'error',
      text: 'Saved 1 of 2. Not saved: b.png: No drop was found. Choose another photo, then save again.',
    });
    const [p1, p2] = useWorkspace.getState().photos;
    expect([p1.savedRevision, p1.dirty]).toEqual([1, false]);
    expect([p2.savedRevision, p2.dirty]).toEqual([null, true]);
    expect(reloads()).toBe(1);
  });

  it('a stale save says so and offers to reload the current revision; the next save is based on it', async () => {
    let answer: 'stale' | 'saved' = 'stale';
    const calls = stubFetch(({ url }) => {
      if (url === '/api/measurement-sessions') return SESSION_CREATED;
      return answer === 'stale'
        ? {
            status: 409,
            body: {
              ...errorBody(
                'stale_revision',
                'This drop was saved as revision 3 since you loaded it.',
              ),
              current: { revision: 3 },
            },
          }
        : { status: 201, body: { revision: 4 } };
    });
    useWorkspace.setState({
      photos: [{ ...analysed('p1', 'a.png'), savedRevision: 1 }],
      selectedId: null,
    });
    const { hook, reloads } = setup();
    await act(() =>
      hook.result.current.saveOne(useWorkspace.getState().photos[0], 'moved the baseline'),
    );
    expect(calls.at(-1)?.body).toMatchObject({ expectedRevision: 1 });
    expect(hook.result.current.message?.kind).toBe('error');
    expect(hook.result.current.stale).toEqual([{ photoId: 'p1', photoName: 'a.png', current: 3 }]);
    expect(useWorkspace.getState().photos[0].savedRevision).toBe(1);

    await act(() => hook.result.current.reloadCurrent(hook.result.current.stale[0]));
    expect(hook.result.current.stale).toEqual([]);
    const [p1] = useWorkspace.getState().photos;
    expect([p1.savedRevision, p1.dirty]).toEqual([3, true]);
    expect(useWorkspace.getState().selectedId).toBe('p1');
    expect(reloads()).toBe(1);

    answer = 'saved';
    await act(() =>
      hook.result.current.saveOne(useWorkspace.getState().photos[0], 'checked revision 3'),
    );
    expect(calls.at(-1)?.body).toMatchObject({ expectedRevision: 3 });
    expect(useWorkspace.getState().photos[0].savedRevision).toBe(4);
  });

  it('says nothing was lost when the server cannot be reached', async () => {
    stubFetch(() => 'offline');
    const { hook } = setup();
    await act(() => hook.result.current.saveOne(useWorkspace.getState().photos[0]));
    expect(hook.result.current.message?.kind).toBe('error');
    expect(hook.result.current.message?.text).toMatch(/could not be reached.*nothing was lost/);
  });

  it(`saves ten photos ${SAVES_AT_ONCE} at a time within the per-user compute limit, waits and sends again while the server is busy, and loses none`, async () => {
    const ten = Array.from({ length: 10 }, (_, i) => analysed(`p${i}`, `drop-${i}.png`));
    useWorkspace.setState({ photos: ten, selectedId: null });
    // The server's limit of 4 per user, with 2 taken by the same user's other work while the
    // first saves run: the third save at once is refused as busy until that work is done.
    let inFlight = 0;
    let most = 0;
    let otherWork = 2;
    let saved = 0;
    let refused = 0;
    const calls = stubFetch(async ({ url }) => {
      if (url === '/api/measurement-sessions') return SESSION_CREATED;
      if (inFlight + otherWork >= COMPUTE_JOBS_PER_USER) {
        refused += 1;
        if (refused === 3) otherWork = 0;
        return BUSY;
      }
      inFlight += 1;
      most = Math.max(most, inFlight);
      await new Promise((resolve) => setTimeout(resolve, 5));
      inFlight -= 1;
      saved += 1;
      return { status: 201, body: { revision: 1, dropId: `d-${url}` } };
    });
    const { steps, unsubscribe } = recordSaveSteps();
    const { hook, waits } = setup();
    await act(() => hook.result.current.saveMany(useWorkspace.getState().photos));
    unsubscribe();

    expect(hook.result.current.message).toEqual({ kind: 'ok', text: 'Saved 10 drops.' });
    expect(
      useWorkspace.getState().photos.map((p) => [p.savedRevision, p.dirty, p.saveState]),
    ).toEqual(ten.map(() => [1, false, null]));
    expect(saved).toBe(10);
    expect(refused).toBe(3);
    expect(most).toBeLessThanOrEqual(SAVES_AT_ONCE);
    expect(calls.filter((c) => c.url.endsWith('/drop'))).toHaveLength(13);
    // Each wait honours Retry-After (5 s) and grows with the attempts of the same photo.
    expect(waits).toHaveLength(3);
    expect(waits.every((ms) => ms >= 5000)).toBe(true);
    // Every photo waited its turn and was saved; a refused one said the server was busy and
    // was sent again.
    const all = [...steps.values()];
    expect(all).toHaveLength(10);
    expect(all.filter((s) => s.includes('retrying')).length).toBeGreaterThan(0);
    for (const s of all) {
      expect(s.slice(0, 2)).toEqual(['queued', 'saving']);
      expect(s.at(-1)).toBe('saved');
      expect(s.slice(2, -1).every((step, i) => step === (i % 2 ? 'saving' : 'retrying'))).toBe(
        true,
      );
    }
  });

  it('a save the server keeps refusing as busy stops after its attempts; the photo stays unsaved in the table, named', async () => {
    const calls = stubFetch(({ url }) =>
      url === '/api/measurement-sessions' ? SESSION_CREATED : BUSY,
    );
    const { hook, waits } = setup();
    const [p1] = useWorkspace.getState().photos;
    await act(() => hook.result.current.saveMany([p1]));
    expect(calls.filter((c) => c.url === '/api/photos/p1/drop')).toHaveLength(BUSY_ATTEMPTS);
    // Retry-After (5 s) or the doubling from 2 s, whichever is longer, never above 30 s.
    expect(waits).toEqual([5000, 5000, 8000, 16000, 30000, 30000, 30000]);
    expect(waits.map((_, i) => busyWaitMs(i + 1, 5))).toEqual(waits);
    const kept = useWorkspace.getState().photos[0];
    expect(photoBadge(kept).label).toBe('Not saved');
    expect(
      photoBadge({ ...kept, saveState: { step: 'retrying', attempt: 2, seconds: 8 } }).label,
    ).toBe('Server busy: retry in 8 s');
    // A saved drop reloaded into the table is badged saved while the browser redraws it; a
    // photo never saved is analysing then.
    const reloaded = { ...kept, status: 'loading' as const, saveState: undefined };
    expect(photoBadge({ ...reloaded, savedRevision: 2, dirty: false }).label).toBe('Saved r2');
    expect(photoBadge(reloaded).label).toBe('Analysing');
    expect([kept.id, kept.savedRevision, kept.dirty, kept.saveState?.step]).toEqual([
      'p1',
      null,
      true,
      'failed',
    ]);
    expect(hook.result.current.message?.text).toMatch(
      /^Saved 0 of 1\. Not saved: a\.png: You already have 4 calculations running/,
    );
  });
});
