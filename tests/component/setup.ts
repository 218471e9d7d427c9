import { cleanup } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// Testing Library unmounts after each test only by itself when vitest's globals are on.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});
