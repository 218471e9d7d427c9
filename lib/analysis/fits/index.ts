import type { FitMethod } from '../types';
import { circleFitter } from './circle';
import { ellipseFitter } from './ellipse';
import { heightWidthFitter } from './height-width';
import { polynomialFitter } from './polynomial';
import type { ProfileFitter } from './types';
import { youngLaplaceFitter } from './young-laplace';

export const FITTERS: Record<FitMethod, ProfileFitter> = {
  circle: circleFitter,
  polynomial: polynomialFitter,
  ellipse: ellipseFitter,
  'young-laplace': youngLaplaceFitter,
  'height-width': heightWidthFitter,
};

export function fitterFor(method: FitMethod): ProfileFitter | undefined {
  return FITTERS[method];
}

export type { ProfileFit, ProfileFitter, FramePoints, ContactAngles, DropShape } from './types';
export { fitCircle, kasaCircle } from './circle';
export { fitEllipse, directEllipse } from './ellipse';
export { fitPolynomial } from './polynomial';
export { fitYoungLaplace } from './young-laplace';
export { fitHeightWidth } from './height-width';
