import { z } from 'zod';
import { ANALYSIS_REVIEW_STATUSES } from './reviews';

/** What the dashboard shows: recent drops, results waiting for review, batches out of spec. */

export const recentDropSchema = z.object({
  dropId: z.string(),
  sampleLabel: z.string(),
  lotCode: z.string(),
  coatingCode: z.string(),
  liquidName: z.string(),
  meanDeg: z.number(),
  /** ISO 8601. */
  measuredAt: z.string(),
  /** Who recorded the drop; null when that account is gone. */
  measuredBy: z.string().nullable(),
  reviewStatus: z.enum(ANALYSIS_REVIEW_STATUSES),
});
export type RecentDrop = z.output<typeof recentDropSchema>;

export const outOfSpecBatchSchema = z.object({
  coatingCode: z.string(),
  lotCode: z.string(),
  producedOn: z.string(),
  liquidName: z.string(),
  rule: z.string(),
  reason: z.string(),
});
export type OutOfSpecBatch = z.output<typeof outOfSpecBatchSchema>;

/** The dashboard's review requests waiting for a decision: how many, and the newest to open. */
export type PendingReviewRequests = {
  count: number;
  newest: {
    id: string;
    title: string;
    submittedBy: string | null;
    submittedAt: Date;
    analysisCount: number;
  }[];
};
