import { useGlobalSearchParams, useLocalSearchParams, usePathname } from 'expo-router';

export const LAB_HOME = '/bench';

/**
 * Where to go after signing in. Only same-site paths are honoured ("/..." but not "//host" or
 * "/\host", which browsers treat as another site), so a crafted link cannot send people elsewhere.
 */
export function safeNextPath(next: string | string[] | undefined): string {
  const candidate = Array.isArray(next) ? next[0] : next;
  if (!candidate || !candidate.startsWith('/')) return LAB_HOME;
  if (candidate.startsWith('//') || candidate.startsWith('/\\')) return LAB_HOME;
  // Sending someone back to the sign-in screen after signing in would loop.
  if (candidate === '/sign-in' || candidate.startsWith('/sign-in?')) return LAB_HOME;
  return candidate;
}

export function useNextPath(): string {
  const { next } = useLocalSearchParams<{ next?: string | string[] }>();
  return safeNextPath(next);
}

/** The path and query of the screen being shown, to come back to after signing in. */
export function useCurrentPath(): string {
  const pathname = usePathname();
  const params = useGlobalSearchParams();
  const query = new URLSearchParams();
  for (const [name, value] of Object.entries(params)) {
    for (const item of Array.isArray(value) ? value : [value]) {
      if (item !== undefined) query.append(name, item);
    }
  }
  const search = query.toString();
  return search ? `${pathname}?${search}` : pathname;
}
