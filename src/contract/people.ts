import { z } from 'zod';
import { ROLES } from '../domain/people/roles';

export const roleSchema = z.enum(ROLES);
export const rolesSchema = z
  .array(roleSchema)
  .min(1, 'Choose at least one role')
  .max(ROLES.length)
  .transform((roles) => ROLES.filter((role) => roles.includes(role)));

const email = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'E-mail address is too long')
  .pipe(z.email('Enter a valid e-mail address'));

/** Passwords: long enough to resist guessing, bounded so bcrypt sees all of it. */
export const newPasswordSchema = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(72, 'Use at most 72 characters');

export const personNameSchema = z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters');

export const loginInputSchema = z.strictObject({
  email,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginInput = z.infer<typeof loginInputSchema>;

export const meSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
});
export type Me = z.infer<typeof meSchema>;

export const userSchema = meSchema.extend({
  active: z.boolean(),
  createdAt: z.string(),
});
export type User = z.infer<typeof userSchema>;

export const inviteInputSchema = z.strictObject({ email, roles: rolesSchema });
export type InviteInput = z.input<typeof inviteInputSchema>;

export const invitationSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  roles: z.array(roleSchema),
  expiresAt: z.string(),
  acceptedAt: z.string().nullable(),
  createdAt: z.string(),
});
export type Invitation = z.infer<typeof invitationSchema>;

export const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{20,100}$/, 'This link is not valid');

export const acceptInvitationInputSchema = z.strictObject({
  token: tokenSchema,
  name: personNameSchema,
  password: newPasswordSchema,
});

export const invitationPreviewSchema = z.object({ email: z.string(), roles: z.array(roleSchema), expiresAt: z.string() });

export const updateUserInputSchema = z
  .strictObject({ roles: rolesSchema.optional(), active: z.boolean().optional() })
  .refine((v) => v.roles !== undefined || v.active !== undefined, 'Send roles or active');

export const passwordResetRequestSchema = z.strictObject({ email });
export const passwordResetCompleteSchema = z.strictObject({ token: tokenSchema, password: newPasswordSchema });

export const profileUpdateSchema = z.strictObject({ name: personNameSchema });
export const passwordChangeSchema = z.strictObject({
  currentPassword: z.string().min(1, 'Enter your current password').max(200),
  newPassword: newPasswordSchema,
});

export const setupStatusSchema = z.object({ needsFirstAdmin: z.boolean(), teamName: z.string().nullable() });
export const firstAdminInputSchema = z.strictObject({
  teamName: z.string().trim().min(1, 'Enter the team name').max(120),
  name: personNameSchema,
  email,
  password: newPasswordSchema,
});

export const mailMessageSchema = z.object({
  id: z.number().int(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  sentAt: z.string(),
});
export type MailMessage = z.infer<typeof mailMessageSchema>;
