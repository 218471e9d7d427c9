import 'server-only';
import { AppError } from '@/lib/app-error';
import { SeriesSourceFailure } from '@/lib/compute/node/tasks';
import type { ReanalyseReply, ReanalyseRequest } from '@/lib/dynamic/node/reanalyse';
import type { Actor } from '../actor';
import { runCompute } from '../compute/pool';

/**
 * Runs a series re-analysis in the server's compute pool (server/compute/pool.ts), so a video of
 * hundreds of frames (seconds to minutes of CPU) never blocks the web server's event loop, counts
 * towards the user's limit of calculations in flight (429 `busy` beyond it) and shares the
 * machine's cores with every other fit instead of starting threads of its own. One series is in
 * the pool at a time; the worker decodes with ffmpeg and analyses with lib/dynamic.
 */

/** The worker's failure as the API's error: the source's problem, or an internal one. */
function toAppError(error: SeriesSourceFailure): Error {
  if (error.failureName === 'VideoError' && error.code === 'unreadable_video')
    return new AppError(
      'unreadable_video',
      `${error.message} Upload the video again or export it as MP4, WebM or AVI (MJPEG).`,
    );
  if (error.failureName === 'DecodeError')
    return new AppError(
      'unreadable_photo',
      `A frame could not be decoded: ${error.message} Upload the frames as PNG, JPEG, TIFF or BMP.`,
    );
  if (error.failureName === 'SeriesSourceError' || error.failureName === 'RangeError')
    return new AppError('bad_input', error.message);
  return new Error(`Series re-analysis failed (${error.failureName}): ${error.message}`);
}

/** Analyses the series for the actor in the pool and answers its result. */
export async function analyseInWorker(
  actor: Actor,
  request: ReanalyseRequest,
): Promise<ReanalyseReply> {
  try {
    return await runCompute(actor.userId, { kind: 'reanalyse-series', request });
  } catch (error) {
    if (error instanceof SeriesSourceFailure) throw toAppError(error);
    throw error;
  }
}
