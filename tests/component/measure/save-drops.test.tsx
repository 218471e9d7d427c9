import { act, render, renderHook, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { beforeEach, describe, expect, it } from 'vitest';
import { useWorkspace, type WorkspacePhoto } from '@/components/measure/store';
import { SessionPanel } from '@/components/measure/session-panel';
import { initialSession } from '@/components/measure/types';
import { useSaveDrops } from '@/components/measure/use-save-drops';
import { errorBody, stubFetch } from '../support';

const LIQUIDS = [
  { id: 'liquid-diiodomethane', name: 'Diiodomethane', hazardNote: 'Harmful.' },
  { id: 'liquid-water', name: 'Water', hazardNote: null },
];

const analysed = (id: string, name: string): WorkspacePhoto => ({
  id,
  name,
  width: 640,
  height: 480,
  status: 'ready',
  error: null,
  result: null,
  baseline: null,
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

function setup(sampleId: string, liquidLot = '') {
  let reloads = 0;
  const created: string[] = [];
  const hook = renderHook(() =>
    useSaveDrops({
      sampleId,
      session: { ...initialSession(LIQUIDS, 'Ana Analyst'), liquidLot },
      method: 'circle',
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
      { ...analysed('p3', 'c.png'), dirty: false },
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
    const { hook } = setup('sample-1', ' W-LOT-0915 ');
    await act(() => hook.result.current.saveAll(useWorkspace.getState().photos));
    await waitFor(() => expect(hook.result.current.saving).toBe(false));
    expect(calls[0].url).toBe('/api/measurement-sessions');
    expect(calls[0].body).toMatchObject({ liquidLot: 'W-LOT-0915', operatorName: 'Ana Analyst' });
  });

  it('the session panel has a liquid-lot field beside the conditions', async () => {
    let value = { ...initialSession(LIQUIDS, 'Ana Analyst') };
    render(
      <SessionPanel
        liquids={LIQUIDS}
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
    const { hook } = setup('');
    await act(() => hook.result.current.saveAll(useWorkspace.getState().photos));
    expect(hook.result.current.message).toEqual({
      kind: 'error',
      text: 'Choose the sample these drops were placed on, then save.',
    });
    expect(calls).toHaveLength(0);
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
    const { hook, created, reloads } = setup('sample-1');
    await act(() => hook.result.current.saveAll(useWorkspace.getState().photos));
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
    const { hook, reloads } = setup('sample-1');
    await act(() => hook.result.current.saveOne(useWorkspace.getState().photos[0]));
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
    await act(() => hook.result.current.saveOne(useWorkspace.getState().photos[0]));
    expect(calls.at(-1)?.body).toMatchObject({ expectedRevision: 3 });
    expect(useWorkspace.getState().photos[0].savedRevision).toBe(4);
  });

  it('says nothing was lost when the server cannot be reached', async () => {
    stubFetch(() => 'offline');
    const { hook } = setup('sample-1');
    await act(() => hook.result.current.saveOne(useWorkspace.getState().photos[0]));
    expect(hook.result.current.message?.kind).toBe('error');
    expect(hook.result.current.message?.text).toMatch(/could not be reached.*nothing was lost/);
  });
});
