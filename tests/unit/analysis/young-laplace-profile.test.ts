/** The Young–Laplace integrator against closed forms and published limits. */
import { describe, expect, it } from 'vitest';
import {
  integrateYoungLaplace,
  profileAtDepth,
  sessileDropProfile,
} from '@/lib/analysis/young-laplace-profile';

describe('Young–Laplace profile (Bashforth & Adams 1883 equations)', () => {
  it('β = 0 is the sphere x = sin φ, z = 1 − cos φ (derivable: constant mean curvature 1/b)', () => {
    const p = integrateYoungLaplace(0, { maxPhi: Math.PI * 0.95 });
    let worst = 0;
    for (let i = 0; i < p.n; i++) {
      worst = Math.max(
        worst,
        Math.abs(p.x[i] - Math.sin(p.phi[i])),
        Math.abs(p.z[i] - (1 - Math.cos(p.phi[i]))),
      );
    }
    expect(worst).toBeLessThan(1e-6);
  });

  it('β → 0 gives the spherical-cap volume πh²(3R − h)/3 and area 2πRh (cap geometry, derivable)', () => {
    for (const thetaDeg of [20, 60, 90, 130, 170]) {
      const theta = (thetaDeg * Math.PI) / 180;
      const p = sessileDropProfile(1e-9, theta);
      const h = p.z[p.n - 1];
      expect(h).toBeCloseTo(1 - Math.cos(theta), 6);
      expect(p.volume[p.n - 1]).toBeCloseTo((Math.PI * h * h * (3 - h)) / 3, 5);
      expect(p.area[p.n - 1]).toBeCloseTo(2 * Math.PI * h, 5);
      // θ/2 relation of a cap: tan(θ/2) = h / a (derivable from the cap geometry).
      const a = p.x[p.n - 1];
      expect((2 * Math.atan(h / a) * 180) / Math.PI).toBeCloseTo(thetaDeg, 4);
    }
  });

  it('large β: puddle height → 2 ℓc sin(θ/2) (de Gennes, Brochard-Wyart & Quéré, Capillarity and Wetting Phenomena, 2004)', () => {
    // The law holds for puddles much wider than the capillary length ℓc; the drop's width grows only
    // like ln β in units of ℓc, so the finite-width excess (∝ ℓc / base radius) is extrapolated away
    // from two large Bond numbers (Richardson extrapolation in 1 / width).
    for (const thetaDeg of [40, 90, 140]) {
      const theta = (thetaDeg * Math.PI) / 180;
      const ratios = [1e6, 1e8].map((bond) => {
        const lc = 1 / Math.sqrt(bond); // capillary length in units of the apex radius
        const p = sessileDropProfile(bond, theta);
        const height = p.z[p.n - 1];
        return { excess: height / (2 * lc * Math.sin(theta / 2)), inverseWidth: lc / p.x[p.n - 1] };
      });
      const [a, b] = ratios;
      // Closer to the law as the puddle widens.
      expect(Math.abs(b.excess - 1)).toBeLessThan(Math.abs(a.excess - 1));
      expect(Math.abs(b.excess - 1)).toBeLessThan(0.08);
      const slope = (a.excess - b.excess) / (a.inverseWidth - b.inverseWidth);
      const limit = b.excess - slope * b.inverseWidth;
      expect(Math.abs(limit - 1)).toBeLessThan(0.01);
    }
  });

  it('gravity flattens: at equal θ a larger β gives a lower drop relative to its base', () => {
    const theta = Math.PI / 2;
    const ratio = (bond: number) => {
      const p = sessileDropProfile(bond, theta);
      return p.z[p.n - 1] / p.x[p.n - 1];
    };
    expect(ratio(0)).toBeCloseTo(1, 6);
    expect(ratio(0.5)).toBeLessThan(ratio(0.1));
    expect(ratio(2)).toBeLessThan(ratio(0.5));
  });

  it('profileAtDepth interpolates the contact angle where the profile meets a given depth', () => {
    const p = integrateYoungLaplace(0, { maxPhi: Math.PI * 0.9 });
    const at = profileAtDepth(p, 1); // z = 1 is the equator of the unit sphere
    expect(at.phi).toBeCloseTo(Math.PI / 2, 4);
    expect(at.x).toBeCloseTo(1, 4);
  });
});
