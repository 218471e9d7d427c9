/** The analysis refuses an image above its pixel limit before any work, with a message that says what to do. */
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { analyseDrop, AnalysisError } from '@/lib/analysis';
import { MAX_ANALYSIS_PIXELS } from '@/lib/analysis/image';
import { DecodeError, decodeImageBytes } from '@/lib/analysis/node/decode';

describe('pixel limit of the analysis', () => {
  it('refuses more than MAX_ANALYSIS_PIXELS gray samples with bad_input', async () => {
    const width = 8000;
    const height = MAX_ANALYSIS_PIXELS / width + 1;
    const image = { width, height, data: new Uint8Array(width * height) };
    const refusal = await analyseDrop(image).catch((error: unknown) => error);
    expect(refusal).toBeInstanceOf(AnalysisError);
    expect((refusal as AnalysisError).code).toBe('bad_input');
    expect((refusal as AnalysisError).message).toMatch(/at most 40 MP\. Crop the photo/);
  });

  it('refuses to decode a photo above the limit, from its header alone', async () => {
    // A solid PNG compresses to a few kB whatever its size; decoding it would take 40+ MB.
    const png = await sharp({
      create: { width: 8000, height: 5001, channels: 3, background: '#808080' },
    })
      .greyscale()
      .png({ compressionLevel: 1 })
      .toBuffer();
    const refusal = await decodeImageBytes(png).catch((error: unknown) => error);
    expect(refusal).toBeInstanceOf(DecodeError);
    expect((refusal as DecodeError).message).toMatch(/8000 × 5001 pixels \(40\.0 MP\)/);
  });
});
