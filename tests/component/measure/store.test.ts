import { beforeEach, describe, expect, it } from 'vitest';
import { photoBadge } from '@/components/measure/photo-table';
import { useWorkspace } from '@/components/measure/store';

const photo = (id: string) => ({ id, name: `${id}.png`, width: 640, height: 480 });

beforeEach(() => {
  useWorkspace.setState({
    photos: [],
    selectedId: null,
    checked: [],
    method: 'young-laplace',
    defaults: { sampleId: 's-default', probeLiquidId: 'water' },
  });
});

describe('the workspace table', () => {
  it('ticks new uploads, shows the newest, and gives them the last sample and liquid', () => {
    const { addPhotos } = useWorkspace.getState();
    addPhotos([photo('a')]);
    addPhotos([photo('b'), photo('c')], { upload: true });
    let state = useWorkspace.getState();
    expect(state.photos.map((p) => p.id)).toEqual(['a', 'b', 'c']);
    expect(state.selectedId).toBe('c');
    expect(state.checked).toEqual(['b', 'c']);
    // The same file again (the server answers with the photo it has): ticked and shown, not added.
    addPhotos([photo('a')], { upload: true });
    state = useWorkspace.getState();
    expect(state.photos.map((p) => p.id)).toEqual(['a', 'b', 'c']);
    expect(state.selectedId).toBe('a');
    expect(state.checked).toEqual(['b', 'c', 'a']);
    expect(state.photos[1]).toMatchObject({ sampleId: 's-default', probeLiquidId: 'water' });
  });

  it('badges a reopened saved photo as saved at once, and as changed after a new baseline', () => {
    const { addPhotos, setResult, setBaseline } = useWorkspace.getState();
    addPhotos([
      {
        ...photo('a'),
        saved: {
          dropId: 'd1',
          sampleId: 's1',
          probeLiquidId: 'water',
          revision: 2,
          method: 'circle',
          baseline: null,
        },
      },
    ]);
    setResult('a', { warnings: [] } as never);
    expect(photoBadge(useWorkspace.getState().photos[0]).label).toBe('Saved r2');
    expect(useWorkspace.getState().photos[0].method).toBe('circle');
    setBaseline('a', { x1: 0, y1: 10, x2: 100, y2: 10 });
    expect(photoBadge(useWorkspace.getState().photos[0]).label).toBe('Changed since r2');
  });

  it('steps through the listed photos, assigns a selection and removes photos', () => {
    const s = useWorkspace.getState();
    s.addPhotos([photo('a'), photo('b'), photo('c')]);
    s.step(['a', 'b', 'c'], 1);
    expect(useWorkspace.getState().selectedId).toBe('b');
    s.step(['a', 'b', 'c'], 1);
    s.step(['a', 'b', 'c'], 1);
    expect(useWorkspace.getState().selectedId).toBe('c');
    s.step(['a', 'c'], -1);
    expect(useWorkspace.getState().selectedId).toBe('a');
    s.assign(['b', 'c'], { sampleId: 's2' });
    expect(useWorkspace.getState().photos.map((p) => p.sampleId)).toEqual([
      's-default',
      's2',
      's2',
    ]);
    s.setChecked(['b', 'c']);
    s.select('b');
    s.removePhotos(['b']);
    const after = useWorkspace.getState();
    expect(after.photos.map((p) => p.id)).toEqual(['a', 'c']);
    expect(after.selectedId).toBe('c');
    expect(after.checked).toEqual(['c']);
  });
});
