"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { Card } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { Select } from "@/components/ui/select";
import { ROLES, type Role } from "@/db/schema";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { ActiveChip } from "./active-chip";
import { AddUserDialog } from "./add-user-dialog";
import { MAIL_PREFERENCE_LABELS, QUERY_KEYS, type UserRow } from "./admin-types";
import { ConfirmDialog } from "./confirm-dialog";
import { formatDateTime } from "@/lib/format/dates";

type Notice = { tone: "success" | "error"; text: string } | null;

const nameCellId = (id: number) => `user-${id}-name`;

const patchUser = (id: number, body: { role?: Role; active?: boolean }) =>
  fetchJson<{ user: UserRow }>(`/api/users/${id}`, { method: "PATCH", body });

/** The user administration table: list, add, change role, deactivate/reactivate. */
export function UsersAdmin({ currentUserId }: { currentUserId: number }) {
  const queryClient = useQueryClient();
  const users = useQuery({
    queryKey: QUERY_KEYS.users,
    queryFn: ({ signal }) => fetchJson<{ users: UserRow[] }>("/api/users", { signal }).then((r) => r.users),
  });
  const [adding, setAdding] = useState(false);
  const [toggling, setToggling] = useState<UserRow | null>(null);
  const [notice, setNotice] = useState<Notice>(null);

  const roleChange = useMutation({
    mutationFn: ({ user, role }: { user: UserRow; role: Role }) => patchUser(user.id, { role }),
    onSuccess: ({ user: updated }, { role }) => {
      // Show the new role at once (no flicker back to the old one while the list refetches).
      queryClient.setQueryData<UserRow[]>(QUERY_KEYS.users, (list) => list?.map((u) => (u.id === updated.id ? updated : u)));
      // Success notices avoid repeating names and e-mails, which the table already shows.
      setNotice({ tone: "success", text: `Role changed to ${ROLE_LABELS[role]}.` });
    },
    onError: (err, { user }) => setNotice({ tone: "error", text: `The role of ${user.name} was not changed: ${errorMessage(err)}` }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: QUERY_KEYS.users }),
  });

  const activeChange = useMutation({
    mutationFn: (user: UserRow) => patchUser(user.id, { active: !user.active }),
    onSuccess: async (_data, user) => {
      await queryClient.invalidateQueries({ queryKey: QUERY_KEYS.users });
      setNotice({ tone: "success", text: user.active ? "The account is deactivated: it can no longer sign in or use API tokens." : "The account is active again." });
      setToggling(null);
    },
  });

  const { isPending: rolePending, variables: roleVariables, mutate: mutateRole } = roleChange;
  const resetActiveChange = activeChange.reset;
  const columns = useMemo(() => {
    const col = createColumnHelper<UserRow>();
    return [
      col.accessor("name", {
        header: "Name",
        cell: (c) => (
          <span id={nameCellId(c.row.original.id)} className="font-medium">
            {c.getValue()}
          </span>
        ),
      }),
      col.accessor("email", { header: "E-mail", meta: { muted: true } }),
      col.accessor((u) => ROLE_LABELS[u.role], {
        id: "role",
        header: "Role",
        cell: ({ row }) => {
          const user = row.original;
          const self = user.id === currentUserId;
          const pendingRole = rolePending && roleVariables?.user.id === user.id ? roleVariables.role : null;
          return (
            <Select
              // Named by the person's name cell; the column header says it is their role. (Not "Role of …", which
              // would also match the add-user form's "Role" label in label-based lookups.)
              aria-labelledby={nameCellId(user.id)}
              title={self ? "You cannot change your own role; ask another administrator" : undefined}
              controlSize="sm"
              className="w-48"
              value={pendingRole ?? user.role}
              disabled={self || pendingRole !== null}
              onChange={(event) => {
                setNotice(null);
                mutateRole({ user, role: event.target.value as Role });
              }}
            >
              {ROLES.map((role) => (
                <option key={role} value={role}>
                  {ROLE_LABELS[role]}
                </option>
              ))}
            </Select>
          );
        },
      }),
      col.accessor((u) => (u.active ? "Active" : "Deactivated"), {
        id: "active",
        header: "Status",
        cell: ({ row }) => <ActiveChip active={row.original.active} />,
      }),
      col.accessor("lastSignInAt", {
        header: "Last sign-in",
        meta: { muted: true },
        sortingFn: "datetime",
        sortUndefined: "last",
        cell: (c) => <span className="whitespace-nowrap tnum">{formatDateTime(c.getValue(), "Never")}</span>,
      }),
      col.accessor((u) => MAIL_PREFERENCE_LABELS[u.mailPreference], { id: "mailPreference", header: "Mail preference", meta: { muted: true } }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => {
          const user = row.original;
          if (user.id === currentUserId) return <span className="text-caption text-ink-subtle">You</span>;
          return (
            <Button
              variant={user.active ? "secondary" : "ghost"}
              size="sm"
              onClick={() => {
                setNotice(null);
                resetActiveChange();
                setToggling(user);
              }}
            >
              {user.active ? "Deactivate" : "Reactivate"}
              <span className="sr-only"> {user.name}</span>
            </Button>
          );
        },
      }),
    ];
  }, [currentUserId, rolePending, roleVariables, mutateRole, resetActiveChange]);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <p className="max-w-prose text-body text-ink-muted">
          Deactivated users cannot sign in and their API tokens stop working; their scans, sign-offs and audit history stay.
        </p>
        <Button
          onClick={() => {
            setNotice(null);
            setAdding(true);
          }}
        >
          Add user
        </Button>
      </div>

      <div aria-live="polite">
        {notice ? (
          <Callout tone={notice.tone} role={notice.tone === "error" ? "alert" : "status"}>
            {notice.text}
          </Callout>
        ) : null}
      </div>

      {users.isError ? (
        <Callout
          tone="error"
          title="The user list could not be loaded"
          actions={
            <Button variant="secondary" size="sm" onClick={() => users.refetch()}>
              Try again
            </Button>
          }
        >
          {errorMessage(users.error)}
        </Callout>
      ) : (
        <Card>
          <DataTable
            data={users.data ?? []}
            columns={columns}
            caption="Users"
            loading={users.isPending}
            getRowId={(u) => String(u.id)}
            filterPlaceholder="Name, e-mail or role"
            initialPageSize={50}
            emptyTitle="No users yet"
            emptyDescription="Add the first colleague with “Add user”."
          />
        </Card>
      )}

      <AddUserDialog
        open={adding}
        onClose={() => setAdding(false)}
        onAdded={({ invited }) => {
          setAdding(false);
          setNotice({
            tone: "success",
            text: invited
              ? "User added. An invitation e-mail is queued: its link lets them choose a password."
              : "User added. They can sign in with the initial password you gave them.",
          });
        }}
      />

      <ConfirmDialog
        open={toggling !== null}
        title={toggling?.active === false ? `Reactivate ${toggling.name}?` : `Deactivate ${toggling?.name ?? "user"}?`}
        confirmLabel={toggling?.active === false ? "Reactivate account" : "Deactivate account"}
        pendingLabel={toggling?.active === false ? "Reactivating…" : "Deactivating…"}
        variant={toggling?.active === false ? "primary" : "danger"}
        pending={activeChange.isPending}
        error={activeChange.error}
        onConfirm={() => {
          if (toggling) activeChange.mutate(toggling);
        }}
        onCancel={() => setToggling(null)}
      >
        {toggling?.active === false ? (
          <p>
            {toggling.name} can sign in again with their existing password (or use “Forgot your password?”), and their unrevoked API
            tokens work again.
          </p>
        ) : (
          <p>
            {toggling?.name} will no longer be able to sign in, and their personal API tokens stop working at once. Their scans, sign-offs
            and history stay. You can reactivate the account later.
          </p>
        )}
      </ConfirmDialog>
    </div>
  );
}

