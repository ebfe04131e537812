import type { QueryClient } from '@tanstack/react-query';
import { type LoaderFunctionArgs, redirect, useNavigate, useSearchParams } from 'react-router-dom';
import { safeNextPath } from '../../config/paths';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { meQueryOptions } from '../../lib/auth';

/** Someone already signed in goes straight on; a failed session check still shows the form. */
export const signInLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const user = await queryClient.ensureQueryData(meQueryOptions()).catch(() => null);
    if (user) throw redirect(safeNextPath(new URL(request.url).searchParams.get('next')));
    return null;
  };

export function SignInRoute() {
  const navigate = useNavigate();
  const [search] = useSearchParams();
  return (
    <div className="flex min-h-dvh flex-col">
      <main className="flex grow items-center justify-center px-4 py-10">
        <div className="w-full max-w-sm">
          <p className="font-mono text-3xl font-bold tracking-tight">Settlescope</p>
          <h1 className="mt-1 mb-6 text-xl font-semibold text-neutral-800">Sign in</h1>
          <SignInForm onSignedIn={() => navigate(safeNextPath(search.get('next')), { replace: true })} />
        </div>
      </main>
    </div>
  );
}
