import 'server-only';
import type { AnalysisError } from '@/lib/analysis/types';
import { AppError } from '@/lib/app-error';
import type { ErrorCode } from '@/lib/contracts/errors';

/** The engine's reasons for producing no result, as they reach HTTP. */
const ENGINE_CODES = ['no_drop_found', 'baseline_not_found', 'fit_failed', 'bad_input'] as const;

/**
 * The engine's error as an AppError. lib/analysis names its codes either way (kebab-case today,
 * snake_case after its rename), so both are mapped here; a code the API does not know yet
 * becomes fit_failed with the engine's message.
 */
export function fromAnalysisError(error: AnalysisError, advice: string): AppError {
  const code = String(error.code).replace(/-/g, '_');
  const known = (ENGINE_CODES as readonly string[]).includes(code);
  return new AppError(known ? (code as ErrorCode) : 'fit_failed', `${error.message} ${advice}`);
}
