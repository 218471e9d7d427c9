/*
 * Size limits of the computation inputs, in one place: the contracts refuse more with a 400 that
 * says what to do (the route's body limit answers 413 before parsing when the body itself is too
 * large). Each limit is well above what a lab produces and low enough that one request cannot
 * hold the server for long.
 */

/** Pendant-drop outline: a 40 MP photo's drop outline has a few thousand points. */
export const MAX_PENDANT_EDGE_POINTS = 20_000;
export const PENDANT_EDGE_TOO_LONG = `At most ${MAX_PENDANT_EDGE_POINTS.toLocaleString('en')} edge points; thin the outline (keep every second point) and send it again.`;

/** Liquids of one surface-energy calculation. */
export const MAX_SURFACE_ENERGY_LIQUIDS = 20;
export const TOO_MANY_LIQUIDS = `At most ${MAX_SURFACE_ENERGY_LIQUIDS} liquids in one calculation; remove some and calculate again.`;

/** Rows of one CSV import of hand-read angles; split larger legacy files. */
export const MAX_IMPORT_ROWS = 5_000;
export const TOO_MANY_IMPORT_ROWS = `Import at most ${MAX_IMPORT_ROWS.toLocaleString('en')} rows at once; split the file.`;

/** Characters of CSV text one import takes (about 1 MB). */
export const MAX_IMPORT_CHARS = 1_000_000;
export const IMPORT_TOO_LONG = `Import at most ${MAX_IMPORT_CHARS.toLocaleString('en')} characters at once; split the file.`;

/**
 * Calculations one user may have running or waiting in the server's compute pool at once
 * (server/compute/pool.ts); one more is 429 `busy` with Retry-After. Clients that send many
 * (the workspace saving a selection) keep below it.
 */
export const COMPUTE_JOBS_PER_USER = 4;
