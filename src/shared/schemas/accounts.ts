import { z } from 'zod';

import { ROLES } from '../permissions';

/** Requests and answers of the accounts API. The client uses the types only (forms validate with yup). */
const email = z.string().trim().toLowerCase().email('Enter an e-mail address such as name@example.org.').max(254);
const password = z.string().min(10, 'Use at least 10 characters.').max(200, 'Use at most 200 characters.');

export const signInInput = z.object({ email, password: z.string().min(1, 'Enter your password.').max(200) });
export type SignInInput = z.infer<typeof signInInput>;

export const signUpInput = z
  .object({
    email,
    password,
    name: z.string().trim().min(1, 'Enter your name.').max(120),
    /** A new organization to own; required unless joining through an invitation. */
    organizationName: z.string().trim().min(2, 'Name your mill, farm or office.').max(160).optional(),
    organizationKind: z.enum(['feed_mill', 'farm', 'advisory']).optional(),
    invitationToken: z.string().min(20).max(100).optional(),
  })
  .refine((v) => v.invitationToken || v.organizationName, { path: ['organizationName'], message: 'Name your mill, farm or office.' });
export type SignUpInput = z.infer<typeof signUpInput>;

export const passwordResetRequestInput = z.object({ email });
export const passwordResetConfirmInput = z.object({ token: z.string().min(20).max(100), password });

export const activeOrganizationInput = z.object({ organizationId: z.number().int().positive() });

export const createInvitationInput = z.object({ email, role: z.enum(ROLES) });
export type CreateInvitationInput = z.infer<typeof createInvitationInput>;

export const acceptInvitationInput = z.object({ token: z.string().min(20).max(100) });

export const updateMemberInput = z.object({ role: z.enum(ROLES) });

export const idParams = z.object({ id: z.coerce.number().int().positive() });

/** What GET /api/auth/me answers. */
export type SessionInfo = {
  user: { id: string; email: string; name: string };
  memberships: { organizationId: number; organizationName: string; organizationKind: 'feed_mill' | 'farm' | 'advisory'; role: (typeof ROLES)[number] }[];
  activeOrganizationId: number | null;
};

export type Member = { id: number; userId: string; name: string; email: string; role: (typeof ROLES)[number]; joinedAt: string };
export type PendingInvitation = { id: number; email: string; role: (typeof ROLES)[number]; expiresAt: string; invitedBy: string | null };
export type InvitationPreview = { organizationName: string; role: (typeof ROLES)[number]; email: string; accountExists: boolean };
