import { z } from 'zod';
import { ROLES } from './roles';
import { emailSchema } from './auth';
import { oneLine } from './text';

export const roleListSchema = z
  .array(z.enum(ROLES).meta({ title: 'Role' }))
  .min(1, 'Choose at least one role')
  .transform((roles) => [...new Set(roles)])
  .meta({ title: 'Roles' });

export const inviteBody = z
  .object({
    email: emailSchema,
    displayName: oneLine(120, { min: 1, label: 'Name' }),
    roles: roleListSchema,
  })
  .strict();

export const updatePersonBody = z
  .object({
    displayName: oneLine(120, { min: 1, label: 'Name' }).optional(),
    roles: roleListSchema.optional(),
    active: z.boolean().meta({ title: 'Active' }).optional(),
  })
  .strict()
  .refine((b) => Object.keys(b).length > 0, { message: 'There is nothing to change' });

export type InviteBody = z.infer<typeof inviteBody>;
export type UpdatePersonBody = z.infer<typeof updatePersonBody>;

/** A person as the API returns them. */
export interface PersonView {
  id: string;
  email: string;
  displayName: string;
  roles: (typeof ROLES)[number][];
  active: boolean;
  hasPassword: boolean;
  /** Signs in with an authenticator code as well. */
  totp: boolean;
  createdAt: string;
}
