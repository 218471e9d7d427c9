import { z } from 'zod';

/** /api/reviews and /api/reviews/[id]/decision: submit results for review, approve or reject. */

export const submitReviewSchema = z.object({
  batchId: z.string().trim().min(1, 'Choose the batch whose results you submit.'),
  sampleId: z.string().trim().min(1).nullable().optional(),
  note: z.string().trim().max(2000, 'Use at most 2000 characters.').default(''),
});
export type SubmitReview = z.output<typeof submitReviewSchema>;

export const reviewDecisionSchema = z
  .object({
    decision: z.enum(['approve', 'reject'], { error: 'Choose approve or reject.' }),
    comment: z.string().trim().max(4000, 'Use at most 4000 characters.').default(''),
    password: z.string().max(200).default(''),
  })
  .superRefine((value, ctx) => {
    if (value.decision === 'reject' && value.comment.length < 3) {
      ctx.addIssue({
        code: 'custom',
        path: ['comment'],
        message: 'Say why the results are rejected, so the analyst can act on it.',
      });
    }
    if (value.decision === 'approve' && value.password.length === 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['password'],
        message: 'Enter your password to sign the approval.',
      });
    }
  });
export type ReviewDecision = z.output<typeof reviewDecisionSchema>;

export const reviewListQuerySchema = z.object({
  // Anything else lists every review, as before.
  status: z
    .string()
    .optional()
    .transform((v) => (v === 'submitted' || v === 'decided' ? v : undefined)),
});

/**
 * A review's states: submitted → approved (signed) or rejected; an approval → revoked only by an
 * explicit revocation with its reason. ('withdrawn' is kept for rows of earlier versions.)
 */
export const REVIEW_STATUSES = [
  'submitted',
  'approved',
  'rejected',
  'withdrawn',
  'revoked',
] as const;
export const ANALYSIS_REVIEW_STATUSES = ['draft', 'submitted', 'approved', 'rejected'] as const;
export type AnalysisReviewStatus = (typeof ANALYSIS_REVIEW_STATUSES)[number];

export const signatureSchema = z.object({
  name: z.string(),
  email: z.string(),
  signedAt: z.string(),
  method: z.literal('password-reconfirmed'),
  digest: z.string(),
});
export type Signature = z.output<typeof signatureSchema>;

export const reviewListItemSchema = z.object({
  id: z.string(),
  scope: z.enum(['sample', 'batch']),
  status: z.enum(REVIEW_STATUSES),
  submittedAt: z.coerce.date(),
  decidedAt: z.coerce.date().nullable(),
  submitNote: z.string(),
  decisionComment: z.string(),
  analysisIds: z.array(z.string()),
  lotCode: z.string(),
  coatingCode: z.string(),
  sampleLabel: z.string().nullable(),
  submittedBy: z.string().nullable(),
  decidedBy: z.string().nullable(),
  revokedAt: z.coerce.date().nullable(),
  revokeReason: z.string(),
  revokedBy: z.string().nullable(),
});
export type ReviewListItem = z.output<typeof reviewListItemSchema>;
export const reviewListResponseSchema = z.object({ reviews: z.array(reviewListItemSchema) });

export const submitReviewResponseSchema = z.object({
  reviewId: z.string(),
  analysisCount: z.number().int(),
});

export const reviewDecisionResponseSchema = z.object({
  status: z.enum(['approved', 'rejected']),
  signature: signatureSchema.nullable(),
});

/** POST /api/reviews/[id]/revocation: withdraws a signed approval, with the reason. */
export const revokeReviewSchema = z.object({
  reason: z
    .string()
    .trim()
    .min(
      10,
      'Say why the approval is withdrawn (at least 10 characters); it goes in the audit log.',
    )
    .max(4000, 'Use at most 4000 characters.'),
});
export type RevokeReview = z.output<typeof revokeReviewSchema>;

export const revokeReviewResponseSchema = z.object({ status: z.literal('revoked') });
/** What the review page draws over a drop's photo: its analysis's stored geometry (null: no photo). */
export type ReviewDropOverlay = {
  photoId: string;
  photoName: string;
  width: number;
  height: number;
  baseline: { x1: number; y1: number; x2: number; y2: number };
  contactLeft: [number, number];
  contactRight: [number, number];
  heightPx: number;
} | null;
