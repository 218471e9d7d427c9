import { describe, expect, it } from 'vitest';
import { AnalysisError, type AnalysisErrorCode } from '@/lib/analysis/types';
import { HTTP_STATUS } from '@/server/http/errors';
import { fromAnalysisError } from '@/server/drops/analysis-error';

describe('the engine’s errors at the API boundary', () => {
  it('map to the same snake_case code whichever way the engine spells it', () => {
    const spellings = [
      ['no-drop-found', 'no_drop_found'],
      ['baseline-not-found', 'baseline_not_found'],
      ['fit-failed', 'fit_failed'],
      ['bad-input', 'bad_input'],
    ] as const;
    for (const [kebab, snake] of spellings) {
      for (const code of [kebab, snake]) {
        const error = fromAnalysisError(
          new AnalysisError(code as AnalysisErrorCode, 'No drop in the photo.'),
          'Choose another photo.',
        );
        expect(error.code).toBe(snake);
        expect(error.message).toBe('No drop in the photo. Choose another photo.');
        expect(HTTP_STATUS[error.code]).toBe(422);
      }
    }
  });

  it('a code the API does not know yet becomes fit_failed with the engine’s message', () => {
    const error = fromAnalysisError(
      new AnalysisError('too-dark' as AnalysisErrorCode, 'The photo is too dark.'),
      'Retake it.',
    );
    expect(error).toMatchObject({
      code: 'fit_failed',
      message: 'The photo is too dark. Retake it.',
    });
  });
});
