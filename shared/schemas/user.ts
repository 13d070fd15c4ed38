import { z } from 'zod';
import { singleLineText } from './fields';

/** The four roles (docs/product.md "Roles"); the order is not a hierarchy. */
export const ROLES = ['admin', 'planner', 'reviewer', 'client'] as const;
export const Role = z.enum(ROLES);
export type Role = z.infer<typeof Role>;

export const Email = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);
/** bcrypt reads the first 72 bytes of a password and ignores the rest without a word. */
export const PASSWORD_MAX_BYTES = 72;
export const Password = z
  .string()
  .min(10, 'Use at least 10 characters')
  .refine((p) => new TextEncoder().encode(p).length <= PASSWORD_MAX_BYTES, {
    message: `Use at most ${PASSWORD_MAX_BYTES} bytes (UTF-8: a letter with an accent takes 2, many symbols 3 or 4)`,
  });

export const LoginInput = z.object({
  email: Email,
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginInput = z.infer<typeof LoginInput>;

export const UserCreateInput = z.object({
  email: Email,
  name: singleLineText().min(1, 'Enter a name').max(120),
  role: Role,
  password: Password,
});
export type UserCreateInput = z.infer<typeof UserCreateInput>;

export const UserUpdateInput = z
  .object({
    name: singleLineText().min(1, 'Enter a name').max(120),
    role: Role,
    active: z.boolean(),
    password: Password,
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UserUpdateInput = z.infer<typeof UserUpdateInput>;

/** An invitation an admin sends: the address, the role, and for a client the project they may see. */
export const InvitationInput = z.object({ email: Email, role: Role, projectId: z.number().int().positive().nullable().optional() }).strict();
export type InvitationInput = z.infer<typeof InvitationInput>;

/** What the invited person gives when taking the invitation up. */
export const InvitationAcceptInput = z.object({ name: singleLineText().min(1, 'Enter your name').max(120), password: Password }).strict();
export type InvitationAcceptInput = z.infer<typeof InvitationAcceptInput>;

/** A user as the API presents it. */
export interface UserDto {
  id: number;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  createdAt: string;
}
