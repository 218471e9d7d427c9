import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import type { AngleTableRow, SpecWindow } from '@/lib/contracts/surface-energy';
import type { SavedSurfaceEnergy } from '@/components/data/resources';
import { judgeTotal } from '@/components/surface-energy/spec-verdict';
import { SurfaceEnergyWorkspace } from '@/components/surface-energy/workspace';
import {
  computeSurfaceEnergy,
  methodAvailability,
  type LiquidAngle,
} from '@/lib/surface-energy/compute';
import { renderFresh, stubFetch, type Call } from '../support';

vi.mock('next/navigation', () => ({ useRouter: () => ({ push: vi.fn(), refresh: vi.fn() }) }));

// Water and diiodomethane with the components commonly cited from Ström, Fredriksson & Stenius
// (1987); the angles are invented. Two liquids allow OWRK and Wu, not the acid–base method.
const row = (
  id: string,
  name: string,
  meanDeg: number,
  total: number,
  dispersive: number,
  polar: number,
  hazardNote: string | null,
): AngleTableRow => ({
  probeLiquidId: id,
  name,
  builtIn: true,
  meanDeg,
  sdDeg: 1.5,
  n: 5,
  gammaTotal: total,
  gammaDispersive: dispersive,
  gammaPolar: polar,
  gammaLW: null,
  gammaPlus: null,
  gammaMinus: null,
  sources: { total: 'Ström et al. 1987' },
  hazardNote,
  analysisIds: [],
});
const ANGLES = [
  row('liquid-water', 'Water', 68, 72.8, 21.8, 51, null),
  row('liquid-diiodomethane', 'Diiodomethane', 42, 50.8, 50.8, 0, 'Harmful if swallowed.'),
];
const LIQUIDS: LiquidAngle[] = ANGLES.map((r) => ({
  probeLiquidId: r.probeLiquidId,
  name: r.name,
  gammaTotal: r.gammaTotal,
  gammaDispersive: r.gammaDispersive!,
  gammaPolar: r.gammaPolar!,
  angleDeg: r.meanDeg,
  angleSdDeg: r.sdDeg!,
  n: r.n,
}));
const FIRST = computeSurfaceEnergy(LIQUIDS, {
  methods: ['owrk'],
  uncertaintyBasis: 'mean',
  envelopeAngleDeg: 0,
});

/** The routes, answered by the same computation the server runs. */
function server(calls: { saved: number }) {
  return stubFetch((call: Call) => {
    const body = call.body as { methods: ('owrk' | 'wu')[]; uncertaintyBasis: 'mean' | 'single' };
    const outputs = computeSurfaceEnergy(LIQUIDS, { ...body, envelopeAngleDeg: 0 });
    if (call.url === '/api/surface-energy/calculate')
      return { body: { availability: methodAvailability(LIQUIDS), outputs } };
    calls.saved += 1;
    const result: SavedSurfaceEnergy = {
      id: `se-${calls.saved}`,
      sampleId: 'sample-d1',
      batchId: null,
      inputs: {
        subject: { kind: 'sample', id: 'sample-d1' },
        options: { ...body, envelopeAngleDeg: 0 },
        liquids: ANGLES,
        readAll: true,
      },
      outputs,
      createdByUserId: 'u1',
      createdByName: 'Ana Analyst',
      createdAt: '2026-03-14T09:30:00.000Z',
    };
    return { status: 201, body: { result } };
  });
}

function renderWorkspace(
  specs: { min: number | null; max: number | null; maxDaysSinceTreatment?: number }[] = [],
  specWindows: SpecWindow[] = [],
) {
  return renderFresh(
    <SurfaceEnergyWorkspace
      subject={{
        kind: 'sample',
        id: 'sample-d1',
        sampleLabel: 'D1',
        batchId: 'batch-f2611',
        lotCode: 'F-2611',
        coatingId: 'coating-pp',
        coatingCode: 'PP-Print',
        coatingName: 'Plasma-treated film',
        treatedAt: null,
        surfaceEnergySpecs: specs.map((s, i) => ({
          id: `spec-${i}`,
          min: s.min,
          max: s.max,
          maxDaysSinceTreatment: s.maxDaysSinceTreatment ?? null,
          note: '',
        })),
      }}
      angleTable={ANGLES}
      liquids={LIQUIDS}
      specWindows={specWindows}
      availability={methodAvailability(LIQUIDS)}
      initialOutputs={FIRST}
      initialSaved={[]}
      canSave
      readAll
    />,
  );
}

describe('surface-energy workspace', () => {
  it('shows the server-rendered OWRK result without asking again, and the caution of a harmful liquid', () => {
    const calls = stubFetch(() => ({ status: 500 }));
    renderWorkspace();
    expect(screen.getByTestId('result-owrk')).toBeTruthy();
    expect(screen.getByTestId('hazard-notes').textContent).toBe(
      'Diiodomethane: Harmful if swallowed.',
    );
    expect(calls).toHaveLength(0);
  });

  it('disables a method the liquids do not allow and says why', () => {
    stubFetch(() => ({ status: 500 }));
    renderWorkspace();
    const acidBase = screen.getByRole('checkbox', { name: /van Oss–Chaudhury–Good/ });
    expect((acidBase as HTMLInputElement).disabled).toBe(true);
    const why = document.getElementById(acidBase.getAttribute('aria-describedby') ?? '');
    expect(why?.textContent).toMatch(/three liquids/);
  });

  it('recomputes with the methods chosen and keeps the last result while none is chosen', async () => {
    const calls = server({ saved: 0 });
    renderWorkspace();
    await userEvent.click(screen.getByRole('checkbox', { name: 'Wu harmonic mean' }));
    await screen.findByTestId('result-wu');
    expect(calls.at(-1)?.body).toMatchObject({ methods: ['owrk', 'wu'], uncertaintyBasis: 'mean' });

    await userEvent.click(screen.getByRole('checkbox', { name: 'Wu harmonic mean' }));
    await userEvent.click(screen.getByRole('checkbox', { name: /^OWRK/ }));
    expect((await screen.findByRole('alert')).textContent).toBe('Choose at least one method.');
    expect(screen.getByTestId('surface-energy-results')).toBeTruthy();
    const sent = calls.length;
    await userEvent.selectOptions(screen.getByLabelText('Uncertainty of'), 'single');
    expect(calls).toHaveLength(sent);
  });

  it('saves with the sample and lists the saved result first', async () => {
    const counter = { saved: 0 };
    const calls = server(counter);
    renderWorkspace();
    expect(screen.getByText('No surface energy saved with this sample yet.')).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Save with the sample' }));
    expect((await screen.findByRole('status')).textContent).toBe('Saved with the sample.');
    expect(calls.at(-1)).toMatchObject({
      url: '/api/samples/sample-d1/surface-energy',
      method: 'POST',
      body: { methods: ['owrk'], uncertaintyBasis: 'mean' },
    });
    const saved = within(screen.getByTestId('saved-results')).getAllByTestId('saved-result');
    expect(saved).toHaveLength(1);
    expect(saved[0].textContent).toMatch(/14 Mar 2026, 09:30 UTC · Ana Analyst/);
  });

  it('checks the total against the coating spec', async () => {
    stubFetch(() => ({ status: 500 }));
    const total = FIRST.results[0].status === 'ok' ? FIRST.results[0].components.gammaTotal : null;
    expect(total).not.toBeNull();
    renderWorkspace([{ min: Math.floor(total!.value) - 5, max: null }]);
    await waitFor(() =>
      expect(screen.getByTestId('spec-verdict').textContent).toMatch(/^Meets the spec/),
    );
  });
});

describe('spec check with a days-since-treatment window', () => {
  it('judges only the drops within the window, as the compare page does', async () => {
    stubFetch(() => ({ status: 500 }));
    // All drops: water 68° → about 47 mN/m. Within the 7-day window only the later, less
    // wetting drops (water 95°, invented) count → about 39 mN/m, below a 42 mN/m limit.
    const windowLiquids = LIQUIDS.map((l) =>
      l.probeLiquidId === 'liquid-water' ? { ...l, angleDeg: 95, n: 2 } : l,
    );
    const windowOutputs = computeSurfaceEnergy(windowLiquids, {
      methods: ['owrk'],
      uncertaintyBasis: 'mean',
      envelopeAngleDeg: 0,
    });
    const all = FIRST.results[0].status === 'ok' ? FIRST.results[0].components.gammaTotal : null;
    const windowed =
      windowOutputs.results[0].status === 'ok'
        ? windowOutputs.results[0].components.gammaTotal
        : null;
    expect(all!.value).toBeGreaterThan(42);
    expect(windowed!.value).toBeLessThan(42);
    renderWorkspace(
      [{ min: 42, max: null, maxDaysSinceTreatment: 7 }],
      [
        {
          specId: 'spec-0',
          maxDaysSinceTreatment: 7,
          counted: 7,
          excluded: 3,
          liquids: windowLiquids,
          outputs: windowOutputs,
        },
      ],
    );
    const verdict = screen.getByTestId('spec-verdict').textContent ?? '';
    expect(verdict).toMatch(/^Does not meet the spec surface free energy ≥ 42 mN\/m/);
    expect(verdict).toContain(`total ${windowed!.value.toFixed(1)}`);
    expect(screen.getByTestId('spec-window').textContent).toMatch(
      /within 7 days of treatment count for this spec, as on the compare page: 7 of 10 drops/,
    );
  });
});

describe('spec check of a total surface free energy', () => {
  it('meets, fails, and warns when a limit is within two standard uncertainties', () => {
    const total = { value: 40, standardUncertainty: 1.5 };
    expect(judgeTotal({ min: 38, max: null }, total)).toEqual({ meets: true, nearLimit: true });
    expect(judgeTotal({ min: 36, max: null }, total)).toEqual({ meets: true, nearLimit: false });
    expect(judgeTotal({ min: 42, max: null }, total)).toEqual({ meets: false, nearLimit: false });
    expect(judgeTotal({ min: null, max: 39 }, total)).toEqual({ meets: false, nearLimit: false });
    expect(judgeTotal({ min: 30, max: 50 }, total)).toEqual({ meets: true, nearLimit: false });
  });
});
