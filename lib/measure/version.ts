import packageJson from '@/package.json';

/** Recorded with every analysis so a result can be traced to the code that computed it. */
export const SOFTWARE_VERSION = `beadline ${packageJson.version}`;
