import { PageHeader } from '../../components/page-header';
import { ChangePasswordForm } from '../../features/auth/components/change-password-form';
import { ROLE_LABELS } from '../../features/users/components/role-labels';
import { useUser } from '../../lib/auth';

export function AccountRoute() {
  const user = useUser();
  return (
    <>
      <PageHeader title="My account" />
      {user && (
        <dl className="mb-8 grid max-w-xl gap-x-6 gap-y-2 sm:grid-cols-[max-content_1fr]">
          <dt className="font-semibold">Name</dt>
          <dd>{user.name}</dd>
          <dt className="font-semibold">E-mail</dt>
          <dd>{user.email}</dd>
          <dt className="font-semibold">Role</dt>
          <dd>{ROLE_LABELS[user.role]}</dd>
        </dl>
      )}
      <section aria-labelledby="change-password">
        <h2 id="change-password" className="mb-3 text-xl font-bold">
          Change password
        </h2>
        <ChangePasswordForm />
      </section>
    </>
  );
}
