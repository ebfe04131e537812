import type { QueryClient } from '@tanstack/react-query';
import { redirect } from 'react-router-dom';
import { paths } from '../../config/paths';
import { logoutAndForget } from '../../features/auth/api/logout';

export const signOutAction = (queryClient: QueryClient) => async () => {
  await logoutAndForget(queryClient);
  return redirect(paths.signIn.href());
};
