/**
 * Node-only video decoding with the system's ffmpeg (Debian's package; `scripts/ffmpeg.sh`
 * installs it when missing; FFMPEG_PATH / FFPROBE_PATH point elsewhere). ffprobe reads the size,
 * frame rate and pixel format; ffmpeg decodes the first video stream and pipes raw gray frames
 * (gray8, or gray16le for sources with more than 8 bits) which are handed out one at a time, so a
 * long video needs memory for about one frame. MP4/H.264, WebM (VP8/VP9), AVI/MJPEG and anything
 * else the installed ffmpeg reads.
 */
import { spawn, execFile } from 'node:child_process';
import type { GrayImage } from '../../analysis/types';
import type { SeriesInputFrame } from '../types';

export type VideoErrorCode = 'ffmpeg_missing' | 'unreadable_video';

export class VideoError extends Error {
  constructor(
    readonly code: VideoErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'VideoError';
  }
}

const ffmpegPath = () => process.env.FFMPEG_PATH || 'ffmpeg';
const ffprobePath = () => process.env.FFPROBE_PATH || 'ffprobe';

const MISSING =
  "ffmpeg is not installed. Install Debian's package (apt-get install ffmpeg), or run `npm test` / `npm start`, which install it when missing.";

export interface VideoInfo {
  width: number;
  height: number;
  /** Frames per second from the container (average rate); null when it does not say. */
  fps: number | null;
  /** Frame count from the container or a packet count; null when unknown. */
  frameCount: number | null;
  codec: string;
  pixelFormat: string;
  /** 16 when the source carries more than 8 bits per sample. */
  bitDepth: 8 | 16;
}

function rate(text: string | undefined): number | null {
  if (!text) return null;
  const [num, den] = text.split('/').map(Number);
  const value = den ? num / den : num;
  return Number.isFinite(value) && value > 0 ? value : null;
}

/** Size, rate and pixel format of the first video stream. */
export function probeVideo(path: string): Promise<VideoInfo> {
  const args = [
    '-v',
    'error',
    '-select_streams',
    'v:0',
    '-count_packets',
    '-show_entries',
    'stream=codec_name,width,height,pix_fmt,avg_frame_rate,r_frame_rate,nb_frames,nb_read_packets,bits_per_raw_sample',
    '-of',
    'json',
    path,
  ];
  return new Promise((resolve, reject) => {
    execFile(ffprobePath(), args, { maxBuffer: 1 << 20 }, (error, stdout, stderr) => {
      if (error && (error as NodeJS.ErrnoException).code === 'ENOENT')
        return reject(new VideoError('ffmpeg_missing', MISSING));
      if (error)
        return reject(
          new VideoError(
            'unreadable_video',
            `Not a readable video (${lastLine(stderr) || error.message}). Give an MP4, WebM or AVI file, or frame images with --fps.`,
          ),
        );
      let stream: Record<string, string | number | undefined> | undefined;
      try {
        stream = (JSON.parse(stdout) as { streams?: Record<string, string | number>[] })
          .streams?.[0];
      } catch {
        stream = undefined;
      }
      if (!stream || !stream.width || !stream.height)
        return reject(new VideoError('unreadable_video', `${path} holds no video stream.`));
      const pixelFormat = String(stream.pix_fmt ?? '');
      const bits = Number(stream.bits_per_raw_sample) || 0;
      const deep =
        bits > 8 || /(9|1[0-6])(le|be)$/.test(pixelFormat) || /^gray1[0-6]/.test(pixelFormat);
      const count = Number(stream.nb_frames) || Number(stream.nb_read_packets) || null;
      resolve({
        width: Number(stream.width),
        height: Number(stream.height),
        fps: rate(String(stream.avg_frame_rate ?? '')) ?? rate(String(stream.r_frame_rate ?? '')),
        frameCount: count,
        codec: String(stream.codec_name ?? ''),
        pixelFormat,
        bitDepth: deep ? 16 : 8,
      });
    });
  });
}

function lastLine(text: string): string {
  return text.trim().split('\n').filter(Boolean).pop() ?? '';
}

export interface DecodeOptions {
  /** Frame rate for the frame times (default: the container's). */
  fps?: number;
  /** From a previous `probeVideo`, to skip probing again. */
  info?: VideoInfo;
}

export interface DecodedFrame extends SeriesInputFrame {
  index: number;
}

/**
 * Decodes every frame of the first video stream, in order, as gray images; frame i is at i / fps
 * seconds. Stopping early (break out of the loop) ends ffmpeg.
 */
export async function* decodeVideoFrames(
  path: string,
  options: DecodeOptions = {},
): AsyncGenerator<DecodedFrame> {
  const info = options.info ?? (await probeVideo(path));
  const fps = options.fps ?? info.fps;
  if (!fps)
    throw new VideoError(
      'unreadable_video',
      `${path} does not state its frame rate; give it with --fps.`,
    );
  const { width, height } = info;
  const sampleBytes = info.bitDepth === 16 ? 2 : 1;
  const frameBytes = width * height * sampleBytes;
  const child = spawn(
    ffmpegPath(),
    [
      '-v',
      'error',
      '-nostdin',
      '-noautorotate',
      '-i',
      path,
      '-map',
      '0:v:0',
      '-fps_mode',
      'passthrough',
      '-f',
      'rawvideo',
      '-pix_fmt',
      info.bitDepth === 16 ? 'gray16le' : 'gray',
      'pipe:1',
    ],
    { stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let stderr = '';
  child.stderr.setEncoding('utf8');
  child.stderr.on('data', (text: string) => {
    if (stderr.length < 20_000) stderr += text;
  });
  const exited = new Promise<number | null>((resolve, reject) => {
    child.on('error', reject);
    child.on('close', (code) => resolve(code));
  });
  // Attach a handler now so an early failure is not reported as unhandled; it is awaited below.
  exited.catch(() => undefined);
  let index = 0;
  let frame = new Uint8Array(frameBytes);
  let filled = 0;
  const image = (bytes: Uint8Array): GrayImage => ({
    width,
    height,
    data:
      sampleBytes === 2 ? new Uint16Array(bytes.buffer, bytes.byteOffset, width * height) : bytes,
  });
  let finished = false;
  try {
    for await (const chunk of child.stdout as AsyncIterable<Buffer>) {
      let offset = 0;
      while (offset < chunk.length) {
        const take = Math.min(frameBytes - filled, chunk.length - offset);
        frame.set(chunk.subarray(offset, offset + take), filled);
        filled += take;
        offset += take;
        if (filled === frameBytes) {
          yield { index, tSec: index / fps, image: image(frame) };
          index++;
          frame = new Uint8Array(frameBytes);
          filled = 0;
        }
      }
    }
    let code: number | null;
    try {
      code = await exited;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT')
        throw new VideoError('ffmpeg_missing', MISSING);
      throw error;
    }
    if (code !== 0)
      throw new VideoError(
        'unreadable_video',
        `ffmpeg could not decode ${path} (${lastLine(stderr) || `exit status ${code}`}).`,
      );
    if (index === 0) throw new VideoError('unreadable_video', `${path} holds no decodable frame.`);
    finished = true;
  } finally {
    if (!finished && child.exitCode === null) child.kill('SIGKILL');
  }
}
