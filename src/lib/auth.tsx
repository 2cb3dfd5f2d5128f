import { createContext, useCallback, useContext, useEffect, useMemo, useState, type ReactNode } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { UserDto } from '@shared/schemas/auth.schema';
import { api, authSession, errorMessage, refreshSession } from './api-client';

export type AuthState =
  | { status: 'restoring' }
  | { status: 'unreachable'; message: string }
  | { status: 'signed-out'; reason: 'initial' | 'signed-out' | 'expired' }
  | { status: 'signed-in'; user: UserDto };

interface AuthContextValue {
  state: AuthState;
  signOut: () => Promise<void>;
  retryRestore: () => void;
}

const AuthContext = createContext<AuthContextValue | null>(null);

function sameUser(a: UserDto, b: UserDto): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

export function AuthProvider({ children }: { children: ReactNode }) {
  const queryClient = useQueryClient();
  const [state, setState] = useState<AuthState>({ status: 'restoring' });
  const [attempt, setAttempt] = useState(0);

  useEffect(() => {
    return authSession.subscribe((event) => {
      if (event.type === 'signed-in') {
        const user = event.session.user;
        setState((prev) =>
          prev.status === 'signed-in' && sameUser(prev.user, user) ? prev : { status: 'signed-in', user },
        );
      } else {
        // Nothing cached for one person may be shown to the next one on this machine.
        queryClient.clear();
        setState({ status: 'signed-out', reason: event.reason });
      }
    });
  }, [queryClient]);

  useEffect(() => {
    let cancelled = false;
    refreshSession()
      .then((session) => {
        if (!cancelled && !session) {
          setState((prev) =>
            prev.status === 'signed-in' ? prev : { status: 'signed-out', reason: 'initial' },
          );
        }
      })
      .catch((error: unknown) => {
        if (!cancelled) setState({ status: 'unreachable', message: errorMessage(error) });
      });
    return () => {
      cancelled = true;
    };
  }, [attempt]);

  const signOut = useCallback(async () => {
    try {
      await api.post('/api/auth/logout');
    } finally {
      authSession.end('signed-out');
    }
  }, []);

  const retryRestore = useCallback(() => {
    setState({ status: 'restoring' });
    setAttempt((n) => n + 1);
  }, []);

  const value = useMemo(() => ({ state, signOut, retryRestore }), [state, signOut, retryRestore]);
  return <AuthContext.Provider value={value}>{children}</AuthContext.Provider>;
}

export function useAuth(): AuthContextValue {
  const value = useContext(AuthContext);
  if (!value) throw new Error('useAuth must be used inside <AuthProvider>');
  return value;
}

/** The signed-in user; only for components rendered behind the sign-in guard. */
export function useUser(): UserDto {
  const { state } = useAuth();
  if (state.status !== 'signed-in') throw new Error('useUser needs a signed-in user');
  return state.user;
}
