/// <reference lib="webworker" />
/**
 * opencv-wasm reads "opencv.wasm" beside its own script with a synchronous XMLHttpRequest (or
 * fetch, depending on the environment). The app serves the installed package's binary at
 * /api/opencv-wasm, so this points that one request there. Imported first by the worker.
 */
const WASM_URL = '/api/opencv-wasm';
const isWasm = (url: string | URL) => String(url).split('?')[0].endsWith('opencv.wasm');

const originalOpen = XMLHttpRequest.prototype.open;
XMLHttpRequest.prototype.open = function open(this: XMLHttpRequest, method: string, url: string | URL, ...rest: unknown[]) {
  return (originalOpen as (...args: unknown[]) => void).call(this, method, isWasm(url) ? WASM_URL : url, ...rest);
} as typeof XMLHttpRequest.prototype.open;

const scope = self as unknown as DedicatedWorkerGlobalScope;
const originalFetch = scope.fetch.bind(scope);
scope.fetch = (input: RequestInfo | URL, init?: RequestInit) => {
  const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
  return originalFetch(isWasm(url) ? WASM_URL : input, init);
};

export {};
