import { z } from 'zod';

/** The four roles of a shop; what each may do is in product.md. */
export const roles = ['owner', 'lead', 'tech', 'writer'] as const;
export const roleSchema = z.enum(roles);
export type Role = z.infer<typeof roleSchema>;

export const roleLabels: Record<Role, string> = {
  owner: 'Shop owner',
  lead: 'Lead technician',
  tech: 'Technician',
  writer: 'Service writer',
};

const email = z.string().trim().toLowerCase().email('Enter an e-mail address like name@shop.com').max(254);
/** Long enough to resist guessing; no composition rules (NIST SP 800-63B). */
export const newPasswordSchema = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');
const personName = z.string().trim().min(1, 'Enter a name').max(100);

export const signInSchema = z.object({ email, password: z.string().min(1, 'Enter your password').max(200) });
export type SignIn = z.infer<typeof signInSchema>;

export const passwordResetRequestSchema = z.object({ email });
export const passwordResetConfirmSchema = z.object({ token: z.string().min(20).max(200), password: newPasswordSchema });

export const invitationCreateSchema = z.object({ email, role: roleSchema });
export const invitationAcceptSchema = z.object({ name: personName, password: newPasswordSchema });

export const roleChangeSchema = z.object({ role: roleSchema });
export const accountUpdateSchema = z.object({ name: personName });
export const passwordChangeSchema = z.object({ currentPassword: z.string().min(1).max(200), newPassword: newPasswordSchema });

/** What `GET /api/auth/me` and a successful sign-in answer. */
export interface Me {
  user: { id: string; email: string; name: string };
  shop: { id: string; name: string };
  role: Role;
  demo: boolean;
}
