/**
 * The zod fields for account input, shared by sign-in, invitations and password resets, so every
 * form refuses the same things with the same messages.
 */
import { z } from 'zod';
import { roles } from '@/lib/auth/roles';

/** RFC 5321 caps a path at 256 octets including the angle brackets, so an address at 254. */
export const emailMaxLength = 254;
export const nameMaxLength = 120;
/** Common practice, no source: at least 10 characters. bcrypt reads only the first 72 bytes. */
export const passwordMinLength = 10;
export const passwordMaxLength = 72;

export const emailField = z
  .string({ error: 'E-mail is required' })
  .trim()
  .min(1, { error: 'E-mail is required' })
  .max(emailMaxLength, { error: `E-mail must be at most ${emailMaxLength} characters` })
  .pipe(z.email({ error: 'E-mail must be a valid address, like name@example.com' }))
  .transform((value) => value.toLowerCase());

export const nameField = z
  .string({ error: 'Name is required' })
  .trim()
  .min(1, { error: 'Name is required' })
  .max(nameMaxLength, { error: `Name must be at most ${nameMaxLength} characters` });

export const newPasswordField = z
  .string({ error: 'Password is required' })
  .min(passwordMinLength, { error: `Password must be at least ${passwordMinLength} characters` })
  .refine((value) => new TextEncoder().encode(value).length <= passwordMaxLength, {
    error: `Password must be at most ${passwordMaxLength} bytes`,
  });

export const roleField = z.enum(roles, { error: 'Role must be admin, engineer, reviewer or regulator' });

/** Sign-in: any password up to the limit is checked (the rules for new passwords do not apply). */
export const signInInputSchema = z.object({
  email: emailField,
  password: z
    .string({ error: 'Password is required' })
    .min(1, { error: 'Password is required' })
    .max(passwordMaxLength * 4, { error: 'Password is too long' }),
});

export const createInvitationInputSchema = z.object({ email: emailField, role: roleField });

const newPasswordPair = z.object({ password: newPasswordField, confirmPassword: z.string() });
const passwordsMatch = (value: { password: string; confirmPassword: string }) =>
  value.password === value.confirmPassword;
const mismatch = { error: 'Passwords do not match', path: ['confirmPassword'] };

export const acceptInvitationInputSchema = newPasswordPair
  .extend({ token: z.string().min(1).max(200), name: nameField })
  .refine(passwordsMatch, mismatch);

export const requestPasswordResetInputSchema = z.object({ email: emailField });

export const resetPasswordInputSchema = newPasswordPair
  .extend({ token: z.string().min(1).max(200) })
  .refine(passwordsMatch, mismatch);

export const changeRoleInputSchema = z.object({
  membershipId: z.coerce.number({ error: 'Member is required' }).int().positive({ error: 'Member is required' }),
  role: roleField,
});
