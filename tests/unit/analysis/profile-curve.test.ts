import { describe, expect, it } from 'vitest';
import { renderDrop } from '@/fixtures/generator/render';
import { analyseDrop } from '@/lib/analysis';

// Geometry check (no outside source needed): the drawn profile must start and end at the contact
// points the angles were read at, and its highest point must be the fitted drop height.
describe('fitted profile for drawing', () => {
  for (const method of ['young-laplace', 'circle'] as const) {
    it(`${method}: runs from contact to contact over the apex`, async () => {
      const { image } = renderDrop({ contactAngleDeg: 75, bond: 0.2, seed: 3 });
      const result = await analyseDrop(image, { method });
      const profile = result.profile!;
      expect(profile.length).toBeGreaterThan(50);
      const [first, last] = [profile[0], profile[profile.length - 1]];
      expect(
        Math.hypot(first[0] - result.contactLeft[0], first[1] - result.contactLeft[1]),
      ).toBeLessThan(1.5);
      expect(
        Math.hypot(last[0] - result.contactRight[0], last[1] - result.contactRight[1]),
      ).toBeLessThan(1.5);
      const baselineY = (result.baseline.y1 + result.baseline.y2) / 2;
      const top = Math.min(...profile.map(([, y]) => y));
      // The circle drawn is the near-contact cap the angles come from; the height is the whole-profile
      // cap's, so under gravity (β = 0.2) the two differ by a pixel or two.
      expect(Math.abs(baselineY - top - result.heightPx)).toBeLessThan(
        method === 'circle' ? 3 : 0.5,
      );
    });
  }

  it('local fits draw no whole profile', async () => {
    const { image } = renderDrop({ contactAngleDeg: 75, bond: 0.2, seed: 3 });
    expect((await analyseDrop(image, { method: 'polynomial' })).profile).toBeNull();
  });
});
