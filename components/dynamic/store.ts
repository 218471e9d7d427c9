'use client';

import { create } from 'zustand';
import type { FitMethod } from '@/lib/analysis/types';
import type { DropSide } from '@/lib/dynamic/tilt';
import type { DynamicKind } from '@/lib/dynamic/measurement';
import type { PhaseWindow } from '@/lib/dynamic/types';

export type WindowName = 'advancing' | 'receding' | 'rate';

/** Where the tilt of each frame comes from, on a tilting-plate series. */
export type TiltSource =
  | { type: 'rate'; rateDegPerSec: string; startDeg: string }
  | { type: 'csv'; fileName: string; text: string; column: string; timeColumn: string };

/**
 * The editor state of the dynamic-wetting page: what the series was taken for, the method, and
 * the windows and settings the user chose. A window left `undefined` follows the detection;
 * `null` says the user removed it.
 */
type DynamicEditorState = {
  kind: DynamicKind;
  method: FitMethod;
  windows: Partial<Record<WindowName, PhaseWindow | null>>;
  tilt: TiltSource;
  downhillSide: DropSide | 'auto';
  initialFrames: number;
  initialDegree: 1 | 2;
  setKind(kind: DynamicKind): void;
  setMethod(method: FitMethod): void;
  setWindow(name: WindowName, window: PhaseWindow | null | undefined): void;
  /** Back to the detected windows (after a new analysis, too). */
  resetWindows(): void;
  setTilt(tilt: TiltSource): void;
  setDownhillSide(side: DropSide | 'auto'): void;
  setInitialFit(frames: number, degree: 1 | 2): void;
};

export const useDynamicEditor = create<DynamicEditorState>((set) => ({
  kind: 'grow-and-withdraw',
  method: 'polynomial',
  windows: {},
  tilt: { type: 'rate', rateDegPerSec: '1', startDeg: '0' },
  downhillSide: 'auto',
  initialFrames: 5,
  initialDegree: 1,
  setKind: (kind) => set({ kind, windows: {} }),
  setMethod: (method) => set({ method }),
  setWindow: (name, window) => set((s) => ({ windows: { ...s.windows, [name]: window } })),
  resetWindows: () => set({ windows: {} }),
  setTilt: (tilt) => set({ tilt }),
  setDownhillSide: (downhillSide) => set({ downhillSide }),
  setInitialFit: (initialFrames, initialDegree) => set({ initialFrames, initialDegree }),
}));
