import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { toNumbers } from '@/components/tensiometry/use-calculation';
import { TensiometryWorkspace } from '@/components/tensiometry/workspace';
import { checkWaterProbe, wilhelmyContactAngle, wilhelmySurfaceTension } from '@/lib/tensiometry';
import { errorBody, renderFresh, stubFetch, type Call } from '../support';

vi.mock('@/components/measure/uploads', () => ({
  useUploadThing: () => ({ startUpload: vi.fn() }),
  photoFileProblem: () => null,
}));

type WilhelmyBody = {
  mode: 'tension' | 'angle';
  forceMilliNewton: number | string;
  plateWidthMm: number;
  plateThicknessMm: number;
  immersionDepthMm?: number;
  liquidDensityGPerCm3?: number;
  liquidSurfaceTensionMilliNewtonPerM?: number;
  save: boolean;
};

/** The Wilhelmy and water-check routes, answered with the computation the server runs. */
function server() {
  let saved = 0;
  return stubFetch((call: Call) => {
    if (call.url === '/api/tensiometry/water-check') {
      const body = call.body as Record<string, number>;
      return {
        body: {
          result: checkWaterProbe(body.measuredMilliNewtonPerM, body.temperatureC, {
            toleranceMilliNewtonPerM: body.toleranceMilliNewtonPerM,
          }),
        },
      };
    }
    const body = call.body as WilhelmyBody;
    if (typeof body.forceMilliNewton !== 'number')
      return {
        status: 400,
        body: errorBody('invalid_input', 'Some fields are not valid. Correct them and try again.', {
          forceMilliNewton: 'Enter the balance force in mN.',
        }),
      };
    const reading = {
      plate: { widthMm: body.plateWidthMm, thicknessMm: body.plateThicknessMm },
      forceMilliNewton: body.forceMilliNewton,
      immersionDepthMm: body.immersionDepthMm,
      liquidDensityGPerCm3: body.liquidDensityGPerCm3,
    };
    const result =
      body.mode === 'tension'
        ? wilhelmySurfaceTension(reading)
        : wilhelmyContactAngle(reading, body.liquidSurfaceTensionMilliNewtonPerM!);
    if (!body.save) return { body: { result } };
    saved += 1;
    return {
      status: 201,
      body: {
        result,
        saved: {
          id: `t-${saved}`,
          kind: body.mode === 'tension' ? 'wilhelmy-tension' : 'wilhelmy-angle',
          inputs: body,
          outputs: result,
          photoId: null,
          createdByUserId: 'u1',
          createdByName: 'Ana Analyst',
          createdAt: '2026-03-14T09:30:00.000Z',
        },
      },
    };
  });
}

const renderPage = () =>
  renderFresh(<TensiometryWorkspace canSave canReadPhotos initialSaved={[]} />);

describe('tensiometry forms', () => {
  it('send numbers as numbers, leave out empty optional fields and keep the rest as typed', () => {
    expect(
      toNumbers({ force: ' 2,83 ', depth: '', density: '', text: 'abc' }, ['depth', 'density']),
    ).toEqual({ force: 2.83, text: 'abc' });
    expect(toNumbers({ force: '' })).toEqual({ force: '' });
  });

  it('Wilhelmy: shows the surface tension with the buoyancy correction', async () => {
    const calls = server();
    renderPage();
    const wilhelmy = within(screen.getByRole('region', { name: 'Wilhelmy plate' }));
    await userEvent.type(wilhelmy.getByLabelText('Force (mN)'), '2.8305');
    await userEvent.clear(wilhelmy.getByLabelText('Immersion depth d (mm)'));
    await userEvent.type(wilhelmy.getByLabelText('Immersion depth d (mm)'), '2');
    await userEvent.type(wilhelmy.getByLabelText('Liquid density ρ (g/cm³)'), '0.998');
    await userEvent.click(wilhelmy.getByRole('button', { name: 'Compute' }));
    // By hand (Wilhelmy 1863): (2.8305 + 0.998·9.80665·19.62·0.10·2·1e-3) / (2·19.72) = 72.74 mN/m.
    const result = await screen.findByTestId('wilhelmy-result');
    expect(result.textContent).toMatch(/Surface tension γ72\.7[34] mN\/m/);
    expect(result.textContent).toMatch(/Buoyancy correction ρ g w t d \(added\)0\.0384 mN/);
    expect(calls[0].body).toEqual({
      mode: 'tension',
      forceMilliNewton: 2.8305,
      plateWidthMm: 19.62,
      plateThicknessMm: 0.1,
      immersionDepthMm: 2,
      liquidDensityGPerCm3: 0.998,
      save: false,
    });
  });

  it('Wilhelmy: switching what is computed clears the previous result and asks for γ', async () => {
    const calls = server();
    renderPage();
    const wilhelmy = within(screen.getByRole('region', { name: 'Wilhelmy plate' }));
    await userEvent.type(wilhelmy.getByLabelText('Force (mN)'), '2.8689');
    await userEvent.click(wilhelmy.getByRole('button', { name: 'Compute' }));
    await screen.findByTestId('wilhelmy-result');
    expect(wilhelmy.queryByLabelText('Liquid surface tension γ (mN/m)')).toBeNull();

    await userEvent.click(wilhelmy.getByLabelText(/Contact angle on a plate/));
    expect(screen.queryByTestId('wilhelmy-result')).toBeNull();
    await userEvent.type(wilhelmy.getByLabelText('Liquid surface tension γ (mN/m)'), '80');
    await userEvent.click(wilhelmy.getByRole('button', { name: 'Compute' }));
    expect((await screen.findByTestId('wilhelmy-result')).textContent).toMatch(/Contact angle θ/);
    expect(calls.at(-1)?.body).toMatchObject({
      mode: 'angle',
      liquidSurfaceTensionMilliNewtonPerM: 80,
    });
  });

  it('Wilhelmy: an answer that arrives after switching what is computed is not shown', async () => {
    let answer: (reply: { body: unknown }) => void = () => undefined;
    stubFetch((call: Call) => {
      const body = call.body as WilhelmyBody;
      const result = wilhelmySurfaceTension({
        plate: { widthMm: body.plateWidthMm, thicknessMm: body.plateThicknessMm },
        forceMilliNewton: Number(body.forceMilliNewton),
      });
      return new Promise((resolve) => {
        answer = resolve;
        void result;
      }).then(() => ({ body: { result } }));
    });
    renderPage();
    const wilhelmy = within(screen.getByRole('region', { name: 'Wilhelmy plate' }));
    await userEvent.type(wilhelmy.getByLabelText('Force (mN)'), '2.8689');
    await userEvent.click(wilhelmy.getByRole('button', { name: 'Compute' }));
    await userEvent.click(wilhelmy.getByLabelText(/Contact angle on a plate/));
    answer({ body: null });
    await waitFor(() => expect(wilhelmy.getByRole('button', { name: 'Compute' })).toBeTruthy());
    await new Promise((r) => setTimeout(r, 50));
    expect(screen.queryByTestId('wilhelmy-result')).toBeNull();
  });

  it('Wilhelmy: puts the server’s error on the field, keeps what was typed, says it once', async () => {
    server();
    renderPage();
    const wilhelmy = within(screen.getByRole('region', { name: 'Wilhelmy plate' }));
    const force = wilhelmy.getByLabelText('Force (mN)');
    await userEvent.type(force, 'abc');
    await userEvent.click(wilhelmy.getByRole('button', { name: 'Compute' }));
    await waitFor(() => expect(force.getAttribute('aria-invalid')).toBe('true'));
    expect(document.getElementById(force.getAttribute('aria-describedby')!)?.textContent).toBe(
      'Enter the balance force in mN.',
    );
    expect((force as HTMLInputElement).value).toBe('abc');
    expect(screen.getAllByText('Enter the balance force in mN.')).toHaveLength(1);
    expect(screen.queryByText(/Some fields are not valid/)).toBeNull();
  });

  it('water check: names the IAPWS reference and flags low water', async () => {
    server();
    renderPage();
    const check = within(screen.getByRole('region', { name: 'Water check' }));
    await userEvent.type(check.getByLabelText('Measured γ (mN/m)'), '70.9');
    await userEvent.click(check.getByRole('button', { name: 'Check' }));
    // IAPWS R1-76(2014): 72.74 mN/m at 20 °C.
    expect((await screen.findByTestId('water-reference')).textContent).toBe('72.74 mN/m');
    expect(screen.getByTestId('water-flag').textContent).toMatch(/^Low — likely contaminated\./);
  });

  it('lists a result saved with "Compute and save" first among the saved results', async () => {
    server();
    renderPage();
    expect(screen.getByText('No tensiometry results saved yet.')).toBeTruthy();
    const wilhelmy = within(screen.getByRole('region', { name: 'Wilhelmy plate' }));
    await userEvent.type(wilhelmy.getByLabelText('Force (mN)'), '2.8689');
    await userEvent.click(wilhelmy.getByRole('button', { name: 'Compute and save' }));
    const item = await screen.findByTestId('saved-result');
    expect(item.textContent).toMatch(/^Wilhelmy, surface tension · γ = 72\.7\d mN\/m/);
    expect(item.textContent).toContain('2026-03-14 09:30 UTC · Ana Analyst');
  });
});
