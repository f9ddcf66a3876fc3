/** The four roles; a person may hold several. */
export const ROLES = ['technician', 'author', 'reviewer', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  technician: 'Technician',
  author: 'Author',
  reviewer: 'Reviewer',
  admin: 'Admin',
};
