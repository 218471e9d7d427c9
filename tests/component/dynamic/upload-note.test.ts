import { describe, expect, it } from 'vitest';
import { uploadDescription } from '@/components/dynamic/use-save-series';

describe('what the save says it uploads', () => {
  it('before anything is analysed: what the chosen input will be sent as', () => {
    expect(uploadDescription(null, 'video')).toBe('as the video file');
    expect(uploadDescription(null, 'frames')).toBe('as frame photos, one per frame image');
    expect(uploadDescription(null, 'camera')).toBe('as frame photos (PNG), one per captured frame');
  });

  it('once a series is analysed: that source, whatever input is chosen now', () => {
    const video = { type: 'video', fileName: 'run-3.mp4' } as const;
    expect(uploadDescription(video, 'video')).toBe('as the video file run-3.mp4');
    expect(uploadDescription(video, 'frames')).toBe('as the video file run-3.mp4');
    expect(uploadDescription({ type: 'frames', count: 31 }, 'video')).toBe(
      'as 31 frame photos, one per frame image',
    );
    expect(uploadDescription({ type: 'camera', count: 1 }, 'camera')).toBe(
      'as 1 frame photo (PNG), one per captured frame',
    );
  });
});
