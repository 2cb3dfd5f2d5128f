import { useMutation } from '@tanstack/react-query';
import { useAuth } from '@/lib/auth';

/** Revokes the refresh cookie on the server, then forgets the token and every cached query. */
export function useLogout() {
  const { signOut } = useAuth();
  return useMutation({ mutationFn: signOut });
}
