import type { ProbeLiquidCheck } from '@/lib/tensiometry';

/** How a water check's outcome reads on screen. */
export const FLAG_TEXT: Record<ProbeLiquidCheck['flag'], { label: string; tone: string }> = {
  'within-tolerance': { label: 'Within tolerance', tone: 'bg-leaf-50 text-leaf-900' },
  'low-likely-contamination': {
    label: 'Low — likely contaminated',
    tone: 'bg-coral-50 text-coral-900',
  },
  'high-check-instrument': {
    label: 'High — check the instrument',
    tone: 'bg-amber-50 text-amber-900',
  },
};
