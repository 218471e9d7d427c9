import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { PendingReviews, RecentDrops } from '@/components/dashboard/sections';

describe('dashboard sections', () => {
  it('links each recent drop to its drop page', () => {
    render(
      <RecentDrops
        approvedOnly={false}
        drops={[
          {
            dropId: 'drop-7f3a',
            sampleLabel: 'P1',
            lotCode: 'B-0412',
            coatingCode: 'HT-200',
            liquidName: 'Water',
            meanDeg: 101.26,
            measuredAt: '2026-12-01T09:30:00.000Z',
            measuredBy: 'Ana Analyst',
            reviewStatus: 'submitted',
          },
        ]}
      />,
    );
    const rows = within(screen.getByTestId('recent-drops')).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(1);
    const link = within(rows[0]).getByRole('link', { name: 'B-0412 · P1' });
    expect(link.getAttribute('href')).toBe('/drops/drop-7f3a');
  });

  it('links the review card’s count to the review list and each request to its review', () => {
    render(
      <PendingReviews
        pending={{
          count: 2,
          newest: [
            {
              id: 'review-9',
              title: 'HT-200 B-0412',
              submittedBy: 'Ana Analyst',
              submittedAt: new Date('2026-12-01T10:00:00Z'),
              analysisCount: 6,
            },
          ],
        }}
      />,
    );
    const count = screen.getByTestId('pending-reviews-count');
    expect(count.textContent).toBe('2');
    expect(count.closest('a')?.getAttribute('href')).toBe('/reviews');
    expect(
      screen.getByRole('link', { name: /requests are waiting for a reviewer/ }).getAttribute('href'),
    ).toBe('/reviews');
    expect(screen.getByRole('link', { name: 'HT-200 B-0412' }).getAttribute('href')).toBe(
      '/reviews/review-9',
    );
  });
});
