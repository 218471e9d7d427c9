import { z } from 'zod';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .min(1, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .email('Enter a valid e-mail address, like name@lab.example.');

export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters for the password.')
  .max(200, 'Use at most 200 characters for the password.');

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password.').max(200, 'That password is too long.'),
});

export const signUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'Use at most 120 characters.'),
  email: emailSchema,
  password: passwordSchema,
  organizationName: z
    .string()
    .trim()
    .min(2, 'Name your lab or organization (at least 2 characters).')
    .max(120, 'Use at most 120 characters.'),
});
