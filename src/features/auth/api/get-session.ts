import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@shared/schemas/roles';
import { api } from '@/lib/api-client';
import { authKeys } from './keys';

export interface SessionUser {
  id: string;
  email: string;
  displayName: string;
  roles: Role[];
  /** Signs in with an authenticator code as well. */
  totp: boolean;
}

export interface SessionInfo {
  user: SessionUser | null;
  csrfToken: string;
  /** The shop requires an authenticator for this person's role and they have none yet. */
  enrolmentRequired?: boolean;
  /** The password was right; a code from the authenticator comes next. */
  secondFactor?: 'totp';
}

export const getSession = () => api.get<SessionInfo>('/api/auth/session');

export const sessionQueryOptions = () =>
  queryOptions({ queryKey: authKeys.session, queryFn: getSession, staleTime: 60_000 });

export const useSession = () => useQuery(sessionQueryOptions());

export const hasRole = (user: SessionUser | null | undefined, ...roles: Role[]) =>
  !!user && roles.some((r) => user.roles.includes(r));
