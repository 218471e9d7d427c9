import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { EnvelopeChart } from '@/components/surface-energy/charts';

const liquids = [
  { name: 'Water', gammaDispersive: 21.8, gammaPolar: 51 },
  { name: 'Diiodomethane', gammaDispersive: 50.8, gammaPolar: 0 },
];
const points = [
  { gammaDispersive: 0, gammaPolar: 30 },
  { gammaDispersive: 20, gammaPolar: 20 },
  { gammaDispersive: 30, gammaPolar: 0 },
];

const caption = () => screen.getByTestId('envelope-plot').querySelector('figcaption')!.textContent!;

describe('wetting-envelope caption', () => {
  it('at θ = 0° speaks of complete spreading, never of an angle below 0°', () => {
    render(<EnvelopeChart envelope={{ angleDeg: 0, points, liquids }} />);
    expect(caption()).toContain('spreads completely on the surface (θ = 0°)');
    expect(caption()).not.toMatch(/(less than|below) 0°/);
  });

  it('at a larger angle says the liquid inside the curve wets below that angle', () => {
    render(<EnvelopeChart envelope={{ angleDeg: 30, points, liquids }} />);
    expect(caption()).toContain('wets the surface with a contact angle below 30°');
  });
});
