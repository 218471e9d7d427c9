export { analyseDrop, analyseDropWith } from './analyse';
export { loadOpenCv, type OpenCv } from './opencv';
export * from './types';
