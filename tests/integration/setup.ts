import { vi } from 'vitest';
import { requestState } from './support/request';

// Route handlers and server actions read cookies and headers through next/headers; in these
// tests they read the simulated request in requestState instead.
vi.mock('next/headers', () => ({
  cookies: async () => ({
    get: (name: string) => {
      const value = requestState.cookies.get(name);
      return value === undefined ? undefined : { name, value };
    },
    getAll: () => [...requestState.cookies].map(([name, value]) => ({ name, value })),
    has: (name: string) => requestState.cookies.has(name),
    set: (name: string, value: string) => {
      requestState.cookies.set(name, value);
    },
    delete: (name: string) => {
      requestState.cookies.delete(name);
    },
  }),
  headers: async () => requestState.headers,
}));

vi.mock('next/cache', () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));
