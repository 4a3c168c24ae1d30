/**
 * Forms and API bodies of accounts, teams and service tokens, shared by the server (validation at the
 * edge) and the client (errors beside the field). Messages name the field.
 */
import { z } from 'zod';
import { ROLES } from './roles';

export const emailField = z
  .string({ message: 'E-mail is required.' })
  .trim()
  .min(1, 'E-mail is required.')
  .max(254, 'E-mail must be at most 254 characters.')
  .pipe(z.email({ message: 'E-mail must look like name@example.test.' }))
  .transform((v) => v.toLowerCase());

/** A new password: at least 12 characters (OWASP Authentication Cheat Sheet allows long passphrases). */
export const newPasswordField = z
  .string({ message: 'Password is required.' })
  .min(12, 'Password must be at least 12 characters.')
  .max(200, 'Password must be at most 200 characters.');

export const nameField = z
  .string({ message: 'Name is required.' })
  .trim()
  .min(1, 'Name is required.')
  .max(100, 'Name must be at most 100 characters.');

export const roleField = z.enum(ROLES, { message: `Role must be one of ${ROLES.join(', ')}.` });

export const signInSchema = z.object({
  email: emailField,
  password: z.string({ message: 'Password is required.' }).min(1, 'Password is required.').max(200, 'Password must be at most 200 characters.'),
});
export type SignInInput = z.input<typeof signInSchema>;

const invitationToken = z.string({ message: 'Token is required.' }).min(10, 'The invitation link is incomplete.').max(200, 'The invitation link is too long.');

/** The accept body: a new person sends name + a new password; someone who already has an account sends their password. */
export const acceptInvitationSchema = z.object({
  token: invitationToken,
  name: nameField.optional(),
  password: z.string({ message: 'Password is required.' }).min(1, 'Password is required.').max(200, 'Password must be at most 200 characters.'),
});

/** What the accept form checks for a new account (the server applies it too). */
export const acceptNewAccountSchema = z.object({ token: invitationToken, name: nameField, password: newPasswordField });

export const resetRequestSchema = z.object({ email: emailField });

export const resetCompleteSchema = z.object({
  token: z.string({ message: 'Token is required.' }).min(10, 'The reset link is incomplete.').max(200, 'The reset link is too long.'),
  password: newPasswordField,
});

export const profileSchema = z.object({ name: nameField });

export const passwordChangeSchema = z.object({
  currentPassword: z.string({ message: 'Current password is required.' }).min(1, 'Current password is required.').max(200, 'Current password must be at most 200 characters.'),
  newPassword: newPasswordField,
});

export const inviteSchema = z.object({ email: emailField, role: roleField });

export const memberRoleSchema = z.object({ role: roleField });

export const packSlugField = z
  .string()
  .trim()
  .regex(/^[a-z0-9][a-z0-9-]{0,62}$/, 'Pack slugs are lower-case letters, digits and hyphens, such as jump-arcs.');

export const createTokenSchema = z.object({
  name: z.string({ message: 'Name is required.' }).trim().min(1, 'Name is required.').max(80, 'Name must be at most 80 characters.'),
  /** Absent or empty: every pack of the team. */
  packSlugs: z.array(packSlugField, { message: 'Packs must be a list of pack slugs.' }).max(100, 'At most 100 packs.').optional(),
});
export type CreateTokenInput = z.input<typeof createTokenSchema>;

/** Splits "jump-arcs, camera-moves" as typed in the tokens form. */
export function splitPackSlugs(text: string): string[] {
  return [...new Set(text.split(/[\s,]+/).map((s) => s.trim()).filter(Boolean))];
}
