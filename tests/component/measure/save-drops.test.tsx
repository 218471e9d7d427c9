import { act, renderHook, waitFor } from '@testing-library/react';
import { beforeEach, describe, expect, it } from 'vitest';
import { useWorkspace, type WorkspacePhoto } from '@/components/measure/store';
import { initialSession } from '@/components/measure/types';
import { useSaveDrops } from '@/components/measure/use-save-drops';
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
      createdByUserId: 'user-analyst',
    },
  },
};

function setup() {
  let reloads = 0;
  const created: string[] = [];
  const hook = renderHook(() =>
    useSaveDrops({
      session: initialSession(LIQUIDS, 'Ana Analyst'),
      onSessionCreated: (id) => created.push(id),
      onSaved: async () => {
        reloads += 1;
      },
    }),
  );
  return { hook, created, reloads: () => reloads };
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
    await act(() => hook.result.current.saveOne(useWorkspace.getState().photos[0], 'moved the baseline'));
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
    await act(() => hook.result.current.saveOne(useWorkspace.getState().photos[0], 'checked revision 3'));
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
});
