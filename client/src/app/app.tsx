import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { paths } from '../config/paths';
import { createQueryClient } from '../lib/query-client';
import { createAppRouter } from './router';

const queryClient = createQueryClient({
  onSessionEnded() {
    const { pathname, search } = router.state.location;
    if (pathname !== paths.signIn.pattern) void router.navigate(paths.signIn.href(pathname + search), { replace: true });
  },
});
const router = createAppRouter(queryClient);

export function App() {
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
