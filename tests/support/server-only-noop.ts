// Vitest stand-in for the 'server-only' guard, which throws outside React Server Components.
export {};
