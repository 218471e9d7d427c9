import type { ProfileFit } from './fits/types';

/**
 * The fitted profile as a polyline in the baseline frame (u along the baseline, v up), from the
 * left contact over the apex to the right contact, for drawing over the photo. Only models that
 * describe the whole drop have one: the spherical cap and the Young–Laplace profile.
 */
export function fittedCurve(fit: ProfileFit, samples = 160): Array<[number, number]> | null {
  return fit.curve?.(samples) ?? null;
}
