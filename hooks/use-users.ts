import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { Accepted } from '@/shared/schemas/auth';
import { User, UserList, type InviteUserInput, type UserUpdateInput } from '@/shared/schemas/user';
import { apiFetch } from './api-client';
import { mailKeys, sessionKeys, STALE_TIMES, userKeys } from './query-keys';

const UserResult = z.object({ user: User });

const STATUS_ORDER: Record<User['status'], number> = { active: 0, invited: 1, deactivated: 2 };

/** Active people first, then pending invitations, then deactivated accounts; by name within each. */
function byStatusThenName(a: User, b: User): number {
  return (
    STATUS_ORDER[a.status] - STATUS_ORDER[b.status] ||
    a.displayName.localeCompare(b.displayName, undefined, { sensitivity: 'base' })
  );
}

function sortPeople(users: User[]): User[] {
  return [...users].sort(byStatusThenName);
}

export function useUsersQuery(options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: userKeys.list(),
    queryFn: async ({ signal }) => (await apiFetch('/api/users', { schema: UserList, signal })).users,
    select: sortPeople,
    staleTime: STALE_TIMES.users,
    enabled: options.enabled ?? true,
  });
}

export function useInviteUserMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: z.output<typeof InviteUserInput>) =>
      (await apiFetch('/api/users/invitations', { method: 'POST', body: input, schema: UserResult })).user,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: userKeys.all });
      void queryClient.invalidateQueries({ queryKey: mailKeys.all });
    },
  });
}

export function useUpdateUserMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ id, changes }: { id: number; changes: z.output<typeof UserUpdateInput> }) =>
      (await apiFetch(`/api/users/${id}`, { method: 'PATCH', body: changes, schema: UserResult })).user,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: userKeys.all });
      // A manager may have changed their own role.
      void queryClient.invalidateQueries({ queryKey: sessionKeys.all });
    },
  });
}

export function useResendInvitationMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => apiFetch(`/api/users/${id}/invitation`, { method: 'POST', schema: Accepted }),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: mailKeys.all });
    },
  });
}
