export { analyseDrop, analyseDropWith, type CarriedFit, type FitCarry } from './analyse';
export { loadOpenCv, type OpenCv } from './opencv';
export * from './types';
