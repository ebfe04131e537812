import { type Organization, roleSchema, type User } from '@shared/schemas/users';
import { useId, useMemo } from 'react';
import { Button } from '../../../components/button';
import { DataTable, type DataTableColumns, MonoCell, tableColumns } from '../../../components/data-table';
import { CONTROL_CLASS } from '../../../components/form-field';
import { useUser } from '../../../lib/auth';
import { formatDate } from '../../../lib/format';
import { useUpdateUser } from '../api/save-user';
import { ROLE_LABELS, ROLE_OPTIONS } from './role-labels';

const column = tableColumns<User>();

function InlineError({ error }: { error: Error | null }) {
  return error ? (
    <p role="alert" className="mt-1 font-semibold text-alarm-900">
      <span aria-hidden="true">✖ </span>
      {error.message}
    </p>
  ) : null;
}

/** Changes a user's role on the spot; your own role is shown, not offered. */
function RoleCell({ user }: { user: User }) {
  const id = useId();
  const me = useUser();
  const update = useUpdateUser(user.id);
  if (me?.id === user.id) return <span>{ROLE_LABELS[user.role]}</span>;
  return (
    <div>
      <label htmlFor={id} className="sr-only">
        Role of {user.name}
      </label>
      <select
        id={id}
        value={user.role}
        disabled={update.isPending}
        onChange={(e) => update.mutate({ role: roleSchema.parse(e.target.value) })}
        className={`${CONTROL_CLASS} min-w-44`}
      >
        {ROLE_OPTIONS.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <InlineError error={update.error} />
    </div>
  );
}

/** Deactivates (or reactivates) an account; a deactivated user can no longer sign in. */
function ActiveCell({ user }: { user: User }) {
  const me = useUser();
  const update = useUpdateUser(user.id);
  return (
    <div className="flex flex-wrap items-center gap-2">
      <span className={user.active ? '' : 'font-bold'}>{user.active ? 'Active' : 'Deactivated'}</span>
      {me?.id !== user.id && (
        <Button
          variant={user.active ? 'danger' : 'secondary'}
          busy={update.isPending}
          busyLabel="Saving…"
          onClick={() => update.mutate({ active: !user.active })}
          aria-label={`${user.active ? 'Deactivate' : 'Reactivate'} ${user.name}`}
        >
          {user.active ? 'Deactivate' : 'Reactivate'}
        </Button>
      )}
      <InlineError error={update.error} />
    </div>
  );
}

function buildColumns(organizationName: (id: number | null) => string): DataTableColumns<User> {
  return [
    column.accessor('name', { header: 'Name', sortFn: 'text', cell: (info) => <span className="font-semibold">{info.getValue()}</span> }),
    column.accessor('email', { header: 'E-mail', sortFn: 'text' }),
    column.accessor('role', { header: 'Role', sortFn: 'text', cell: (info) => <RoleCell user={info.row.original} /> }),
    column.accessor((u) => organizationName(u.organizationId), { id: 'organization', header: 'Organisation', sortFn: 'text' }),
    column.accessor((u) => (u.active ? 'active' : 'deactivated'), {
      id: 'active',
      header: 'Status',
      sortFn: 'text',
      cell: (info) => <ActiveCell user={info.row.original} />,
    }),
    column.accessor('createdAt', { header: 'Since', sortFn: 'alphanumeric', cell: (info) => <MonoCell>{formatDate(info.getValue())}</MonoCell> }),
  ];
}

export function UsersTable({ users, organizations }: { users: User[]; organizations: Organization[] }) {
  const columns = useMemo(() => {
    const names = new Map(organizations.map((o) => [o.id, o.name]));
    return buildColumns((id) => (id == null ? '—' : (names.get(id) ?? `#${id}`)));
  }, [organizations]);
  return <DataTable caption="Users" columns={columns} data={users} initialSorting={[{ id: 'name', desc: false }]} />;
}
