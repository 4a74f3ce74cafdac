import { useMemo, useState } from 'react';
import { createColumnHelper } from '@tanstack/react-table';
import { Button } from '@/components/ui/button';
import { DataTable, pagedTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { SelectField } from '@/components/ui/field';
import { FilterBar } from '@/components/ui/filter-bar';
import { Notice } from '@/components/ui/notice';
import { PageHeader } from '@/components/ui/page-header';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDate } from '@/lib/format';
import { ROLES, roleLabels } from '@/lib/roles';
import { oneOf, useListSearchParams } from '@/lib/use-list-search-params';
import { usersExportUrl } from '../api/export-users';
import { USER_SORTS, useUsers, type UserListItem } from '../api/get-users';
import { ChangeRoleDialog } from './change-role-dialog';
import { CreateUserDialog } from './create-user-dialog';
import { SetActiveDialog } from './set-active-dialog';
import { SetPasswordDialog } from './set-password-dialog';

const col = createColumnHelper<UserListItem>();

function readFilters(search: URLSearchParams) {
  const active = search.get('active');
  return {
    q: search.get('q')?.trim() || undefined,
    role: oneOf(search.get('role'), ROLES),
    active: active === 'true' ? true : active === 'false' ? false : undefined,
  };
}

/** The people who use Reboundry: find, add, change role, set a temporary password, deactivate and reactivate. */
export function UsersAdmin({ currentUserId }: { currentUserId: number }) {
  const [params, update] = useListSearchParams({ sorts: USER_SORTS, defaultSort: 'name', readFilters });
  const query = useUsers(params);
  const [creating, setCreating] = useState(false);
  const [roleFor, setRoleFor] = useState<UserListItem | null>(null);
  const [activeFor, setActiveFor] = useState<UserListItem | null>(null);
  const [passwordFor, setPasswordFor] = useState<UserListItem | null>(null);
  const [message, setMessage] = useState<string | null>(null);

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Name',
        cell: (c) => (
          <span className="font-medium">
            {c.getValue()}
            {c.row.original.id === currentUserId ? <span className="ml-1.5 font-normal text-slate">(you)</span> : null}
          </span>
        ),
      }),
      col.accessor('email', { header: 'E-mail', cell: (c) => <span className="break-all">{c.getValue()}</span> }),
      col.accessor('role', { header: 'Role', cell: (c) => roleLabels[c.getValue()] }),
      col.accessor('active', {
        header: 'Sign-in',
        enableSorting: false,
        cell: (c) =>
          !c.getValue() ? (
            <StatusBadge tone="neutral">Deactivated</StatusBadge>
          ) : c.row.original.mustChangePassword ? (
            <span className="flex flex-wrap gap-1.5">
              <StatusBadge tone="ok">Active</StatusBadge>
              <StatusBadge tone="watch">Temporary password</StatusBadge>
            </span>
          ) : (
            <StatusBadge tone="ok">Active</StatusBadge>
          ),
      }),
      col.accessor('createdAt', {
        header: 'Added',
        cell: (c) => <span className="tabular whitespace-nowrap">{formatDate(c.getValue())}</span>,
      }),
      col.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        meta: { label: 'Actions', className: 'text-right whitespace-nowrap' },
        cell: (c) => {
          const u = c.row.original;
          const self = u.id === currentUserId;
          return (
            <div className="flex justify-end gap-1.5">
              <Button size="sm" variant="quiet" onClick={() => setRoleFor(u)} aria-label={`Change role for ${u.name}`} disabled={self} title={self ? 'Another manager can change your role.' : undefined}>
                Change role
              </Button>
              <Button
                size="sm"
                variant="quiet"
                onClick={() => setPasswordFor(u)}
                aria-label={`Set temporary password for ${u.name}`}
                disabled={self}
                title={self ? 'Change your own password on your Account page.' : undefined}
              >
                Set temporary password
              </Button>
              <Button
                size="sm"
                variant="quiet"
                onClick={() => setActiveFor(u)}
                aria-label={`${u.active ? 'Deactivate' : 'Reactivate'} ${u.name}`}
                disabled={self}
                title={self ? 'You cannot deactivate your own account.' : undefined}
              >
                {u.active ? 'Deactivate' : 'Reactivate'}
              </Button>
            </div>
          );
        },
      }),
    ],
    [currentUserId],
  );

  const filtered = Boolean(params.q || params.role || params.active !== undefined);

  return (
    <>
      <title>People · Reboundry</title>
      <PageHeader
        title="People"
        description="Everyone who can sign in to Reboundry, and what their role lets them do."
        actions={
          <Button variant="primary" onClick={() => setCreating(true)}>
            Add a person
          </Button>
        }
      />
      {message ? (
        <Notice tone="ok" className="mb-4">
          {message}
        </Notice>
      ) : null}
      <DataTable
        columns={columns}
        {...pagedTableProps(query, params, update, { noun: ['person', 'people'], exportUrl: usersExportUrl(params) })}
        toolbar={
          <FilterBar
            label="Filter people"
            columns="md:grid-cols-[minmax(12rem,1.5fr)_repeat(2,minmax(9rem,1fr))_auto]"
            search={{ label: 'Name or e-mail', value: params.q ?? '', onChange: (q) => update({ q: q || undefined }) }}
            filtered={filtered}
            onClear={() => update({ q: undefined, role: undefined, active: undefined })}
          >
            <SelectField
              label="Role"
              value={params.role ?? ''}
              onChange={(e) => update({ role: oneOf(e.target.value, ROLES) })}
              options={[{ value: '', label: 'Any role' }, ...ROLES.map((r) => ({ value: r, label: roleLabels[r] }))]}
            />
            <SelectField
              label="Sign-in"
              value={params.active === undefined ? '' : String(params.active)}
              onChange={(e) => update({ active: e.target.value === '' ? undefined : e.target.value === 'true' })}
              options={[
                { value: '', label: 'Active and deactivated' },
                { value: 'true', label: 'Active only' },
                { value: 'false', label: 'Deactivated only' },
              ]}
            />
          </FilterBar>
        }
        empty={
          filtered ? (
            <EmptyState title="Nobody matches these filters">Try a shorter search or clear a filter.</EmptyState>
          ) : (
            <EmptyState title="Nobody here yet" action={<Button onClick={() => setCreating(true)}>Add a person</Button>}>
              Add the managers, mechanics and drivers who will use Reboundry.
            </EmptyState>
          )
        }
      />
      <CreateUserDialog
        open={creating}
        onClose={() => setCreating(false)}
        onCreated={(u) => setMessage(`${u.name} is added as a ${roleLabels[u.role].toLowerCase()} and can sign in now. They choose their own password when they first sign in.`)}
      />
      <ChangeRoleDialog user={roleFor} onClose={() => setRoleFor(null)} onDone={setMessage} />
      <SetPasswordDialog user={passwordFor} onClose={() => setPasswordFor(null)} onDone={setMessage} />
      <SetActiveDialog user={activeFor} onClose={() => setActiveFor(null)} onDone={setMessage} />
    </>
  );
}
