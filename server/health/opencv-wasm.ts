import 'server-only';
import { readFile } from 'node:fs/promises';
import path from 'node:path';

let cached: Promise<Buffer> | null = null;

/** The opencv-wasm package's .wasm file, read once per process. */
export function readOpenCvWasm(): Promise<Buffer> {
  cached ??= readFile(path.join(process.cwd(), 'node_modules', 'opencv-wasm', 'opencv.wasm'));
  return cached;
}
