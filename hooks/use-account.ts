import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { Accepted, type AccountUpdateInput, type ChangePasswordInput } from '@/shared/schemas/auth';
import { User } from '@/shared/schemas/user';
import { apiFetch } from './api-client';
import { sessionKeys, userKeys } from './query-keys';

const UserResult = z.object({ user: User });

export function useUpdateAccountMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: z.output<typeof AccountUpdateInput>) =>
      (await apiFetch('/api/account', { method: 'PATCH', body: input, schema: UserResult })).user,
    onSuccess: (user) => {
      queryClient.setQueryData<User>(sessionKeys.current(), user);
      // A manager sees their own name in the people list too.
      void queryClient.invalidateQueries({ queryKey: userKeys.all });
    },
  });
}

export function useChangePasswordMutation() {
  return useMutation({
    mutationFn: (input: z.output<typeof ChangePasswordInput>) =>
      apiFetch('/api/account/password', { method: 'POST', body: input, schema: Accepted }),
  });
}
