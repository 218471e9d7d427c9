/**
 * OpenCV (opencv-wasm) loaded once per process / worker, behind a small typed facade.
 * opencv-wasm ships `any` typings, so the few functions used here are declared explicitly.
 */

export interface CvMat {
  rows: number;
  cols: number;
  data: Uint8Array;
  data32S: Int32Array;
  data32F: Float32Array;
  delete(): void;
  isDeleted?(): boolean;
}

export interface CvMatVector {
  size(): number;
  get(index: number): CvMat;
  delete(): void;
}

export interface CvSize {
  width: number;
  height: number;
}

export interface OpenCv {
  Mat: new (rows?: number, cols?: number, type?: number) => CvMat;
  MatVector: new () => CvMatVector;
  Size: new (width: number, height: number) => CvSize;
  matFromArray(rows: number, cols: number, type: number, data: ArrayLike<number>): CvMat;
  GaussianBlur(
    src: CvMat,
    dst: CvMat,
    ksize: CvSize,
    sigmaX: number,
    sigmaY: number,
    borderType: number,
  ): void;
  Canny(
    src: CvMat,
    dst: CvMat,
    threshold1: number,
    threshold2: number,
    apertureSize: number,
    L2gradient: boolean,
  ): void;
  threshold(src: CvMat, dst: CvMat, thresh: number, maxval: number, type: number): number;
  findContours(
    image: CvMat,
    contours: CvMatVector,
    hierarchy: CvMat,
    mode: number,
    method: number,
  ): void;
  contourArea(contour: CvMat, oriented: boolean): number;
  CV_8UC1: number;
  BORDER_REPLICATE: number;
  BORDER_DEFAULT: number;
  THRESH_BINARY_INV: number;
  THRESH_OTSU: number;
  RETR_EXTERNAL: number;
  CHAIN_APPROX_NONE: number;
  /** Emscripten heap, to report wasm memory use. */
  HEAPU8: Uint8Array;
}

// The Emscripten module object is a "thenable"; resolving a promise with it directly never settles,
// so promises carry it inside a holder.
let loading: Promise<{ cv: OpenCv }> | null = null;
let loaded: OpenCv | null = null;

/**
 * Resolves once the wasm runtime is ready; later calls return the same instance. The module comes
 * inside `{ cv }` because a promise cannot resolve to the (thenable) module object itself.
 */
export function loadOpenCv(): Promise<{ cv: OpenCv }> {
  if (!loading) {
    loading = import('opencv-wasm').then(
      (mod) =>
        new Promise<{ cv: OpenCv }>((resolve) => {
          // The package exports `{ cv }` in CommonJS; bundlers may wrap it in `default`.
          const wrapped = mod as unknown as { cv?: unknown; default?: { cv?: unknown } };
          const cv = (wrapped.cv ?? wrapped.default?.cv) as OpenCv & {
            onRuntimeInitialized?: () => void;
          };
          if (typeof cv.Mat === 'function') {
            loaded = cv;
            resolve({ cv });
          } else {
            cv.onRuntimeInitialized = () => {
              loaded = cv;
              resolve({ cv });
            };
          }
        }),
    );
  }
  return loading;
}

/** The instance, if `loadOpenCv` has already resolved. */
export function openCvIfLoaded(): OpenCv | null {
  return loaded;
}
