/** Polls `read` every 200 ms until `done` says so or `timeoutMs` passes; answers the last value. */
export async function until<T>(
  read: () => T | Promise<T>,
  done: (value: T) => boolean,
  timeoutMs: number,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (done(value) || Date.now() > deadline) return value;
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
