import type { User } from '../../../shared/api/auth';
import { useMe } from './get-me';

/**
 * The signed-in person, for pages inside the signed-in area (whose layout has already waited
 * for `useMe` and sent anyone signed out to sign-in).
 */
export function useCurrentUser(): User {
  const { data } = useMe();
  if (!data) throw new Error('useCurrentUser used outside the signed-in area');
  return data;
}
