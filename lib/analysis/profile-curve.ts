import type { ProfileFit } from './fits/types';
import { integrateYoungLaplace } from './young-laplace';

/**
 * The fitted profile as a polyline in the baseline frame (u along the baseline, v up), from the
 * left contact over the apex to the right contact, for drawing over the photo. Only models that
 * describe the whole drop have one: the spherical cap and the Young–Laplace profile.
 */
export function fittedCurve(fit: ProfileFit, samples = 160): Array<[number, number]> | null {
  if (fit.method === 'circle') {
    const [cu, cv, r] = fit.parameters;
    if (!(r > 0)) return null;
    // Angles (from the centre) where the circle is above the baseline v = 0.
    const limit = Math.abs(cv) >= r ? Math.PI : Math.acos(Math.max(-1, Math.min(1, -cv / r)));
    const curve: Array<[number, number]> = [];
    for (let i = 0; i <= samples; i++) {
      const a = Math.PI / 2 + limit - (2 * limit * i) / samples;
      curve.push([cu + r * Math.cos(a), Math.max(0, cv + r * Math.sin(a))]);
    }
    return curve;
  }
  if (fit.method === 'young-laplace') {
    const [u0, v0, b, bond] = fit.parameters;
    if (!(b > 0) || !(v0 > 0)) return null;
    const profile = integrateYoungLaplace(bond, { maxZ: v0 / b });
    const step = Math.max(1, Math.floor(profile.n / samples));
    const right: Array<[number, number]> = [];
    for (let i = 0; i < profile.n; i += step)
      right.push([u0 + b * profile.x[i], v0 - b * profile.z[i]]);
    const left = right.map(([u, v]): [number, number] => [2 * u0 - u, v]).reverse();
    return [...left, ...right];
  }
  return null;
}
