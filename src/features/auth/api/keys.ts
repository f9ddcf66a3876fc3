/** Every query key of sign-in and session; the queryOptions beside it own them. */
export const authKeys = {
  session: ['session'] as const,
  invitation: (token: string) => ['invitation', token] as const,
};
