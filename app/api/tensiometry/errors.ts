import { HttpError, forbidden } from '@/lib/api/errors';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import { TensiometryInputError } from '@/lib/tensiometry';

const FIELD_OF_CODE: Record<string, string> = {
  'missing-density': 'liquidDensityGPerCm3',
  'implausible-force': 'forceMilliNewton',
  'out-of-range': 'temperatureC',
  'too-few-points': 'edge',
  'angle-out-of-range': 'contactAngleDeg',
  // Pendant drop from an uploaded photo: the outline could not be found in it.
  'bad-image': 'photoId',
  'low-contrast': 'photoId',
  'no-drop': 'photoId',
};

/** Runs a tensiometry calculation; input it cannot use becomes a 422 naming the field. */
export function calculate<T>(compute: () => T): T {
  try {
    return compute();
  } catch (error) {
    if (error instanceof TensiometryInputError) {
      const field = FIELD_OF_CODE[error.code];
      throw new HttpError(
        422,
        'invalid_measurement',
        error.message,
        field ? { [field]: error.message } : undefined,
      );
    }
    throw error;
  }
}

/** Computing is open to every member; storing the result (`save: true`) needs 'records:write'. */
export function assertMaySave(ctx: OrgContext, save: boolean): void {
  if (save && !can(ctx.organization.role, 'records:write'))
    throw forbidden('save tensiometry results');
}
