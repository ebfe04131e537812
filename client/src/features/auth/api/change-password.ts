import type { ChangePasswordInput } from '@shared/schemas/users';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export function changePassword(input: ChangePasswordInput): Promise<void> {
  return api.post('/api/auth/password', input);
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
