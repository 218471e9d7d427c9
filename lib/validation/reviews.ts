import { z } from 'zod';

export const submitReviewSchema = z.object({
  batchId: z.string().trim().min(1, 'Choose the batch whose results you submit.'),
  sampleId: z.string().trim().min(1).nullable().optional(),
  note: z.string().trim().max(2000, 'Use at most 2000 characters.').default(''),
});

export const reviewDecisionSchema = z
  .object({
    decision: z.enum(['approve', 'reject'], { error: 'Choose approve or reject.' }),
    comment: z.string().trim().max(4000, 'Use at most 4000 characters.').default(''),
    password: z.string().max(200).default(''),
  })
  .superRefine((value, ctx) => {
    if (value.decision === 'reject' && value.comment.length < 3) {
      ctx.addIssue({ code: 'custom', path: ['comment'], message: 'Say why the results are rejected, so the analyst can act on it.' });
    }
    if (value.decision === 'approve' && value.password.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['password'], message: 'Enter your password to sign the approval.' });
    }
  });
