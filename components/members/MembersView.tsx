"use client";
import { useMemo, useState } from "react";
import {
  Alert,
  Button,
  Card,
  ConfirmDialog,
  DataTable,
  Mono,
  PageHeader,
  RoleBadge,
  Select,
  createDataTableColumns,
} from "@/components/ui";
import { ROLES, ROLE_LABEL, type Role } from "@/lib/auth/permissions";
import type { InvitationDto, MemberDto } from "@/lib/schemas/members";
import { InviteForm } from "./InviteForm";
import { useChangeRole } from "./use-change-role";
import { useInvitations } from "./use-invitations";
import { useMembers } from "./use-members";
import { useRemoveMember } from "./use-remove-member";
import { useRevokeInvitation } from "./use-revoke-invitation";

const memberCol = createDataTableColumns<MemberDto>();
const inviteCol = createDataTableColumns<InvitationDto>();
const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium" });

export function MembersView({ canManage, myUserId, studioName }: { canManage: boolean; myUserId: string; studioName: string }) {
  const members = useMembers();
  const invitations = useInvitations(canManage);
  const changeRole = useChangeRole();
  const removeMember = useRemoveMember();
  const revoke = useRevokeInvitation();
  const [removing, setRemoving] = useState<MemberDto | null>(null);
  const [actionError, setActionError] = useState<string | null>(null);

  const memberColumns = useMemo(
    () =>
      memberCol.columns([
        memberCol.accessor("name", {
          header: "Name",
          cell: (c) => (
            <span>
              {c.getValue()} {c.row.original.userId === myUserId ? <span className="text-ink-muted">(you)</span> : null}
            </span>
          ),
        }),
        memberCol.accessor("email", { header: "E-mail", cell: (c) => <Mono>{c.getValue()}</Mono> }),
        memberCol.accessor("role", {
          header: "Role",
          cell: (c) =>
            canManage ? (
              <Select
                aria-label={`Role of ${c.row.original.name}`}
                value={c.getValue()}
                disabled={changeRole.isPending}
                onChange={async (e) => {
                  setActionError(null);
                  try {
                    await changeRole.mutateAsync({ memberId: c.row.original.id, role: e.target.value as Role });
                  } catch (err) {
                    setActionError(err instanceof Error ? err.message : "The role could not be changed.");
                  }
                }}
              >
                {ROLES.map((r) => (
                  <option key={r} value={r}>{ROLE_LABEL[r]}</option>
                ))}
              </Select>
            ) : (
              <RoleBadge role={c.getValue()} />
            ),
        }),
        memberCol.accessor((m) => new Date(m.joinedAt), { id: "joinedAt", header: "Joined", sortFn: "datetime", cell: (c) => <Mono>{dateFormat.format(c.getValue())}</Mono> }),
        memberCol.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) =>
            canManage ? (
              <div className="flex justify-end">
                <Button size="sm" variant="ghost" onClick={() => { setActionError(null); setRemoving(row.original); }}>
                  Remove
                </Button>
              </div>
            ) : null,
        }),
      ]),
    [canManage, myUserId, changeRole],
  );

  const inviteColumns = useMemo(
    () =>
      inviteCol.columns([
        inviteCol.accessor("email", { header: "Invited", cell: (c) => <Mono>{c.getValue()}</Mono> }),
        inviteCol.accessor("role", { header: "Role", cell: (c) => <RoleBadge role={c.getValue()} /> }),
        inviteCol.accessor((i) => new Date(i.expiresAt), { id: "expiresAt", header: "Expires", sortFn: "datetime", cell: (c) => <Mono>{dateFormat.format(c.getValue())}</Mono> }),
        inviteCol.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) => (
            <div className="flex justify-end">
              <Button size="sm" variant="ghost" loading={revoke.isPending && revoke.variables === row.original.id} onClick={() => revoke.mutate(row.original.id)}>
                Withdraw
              </Button>
            </div>
          ),
        }),
      ]),
    [revoke],
  );

  return (
    <div className="space-y-8">
      <PageHeader title="Members" description={`People in ${studioName} and their roles.`} />
      {actionError ? <Alert tone="error">{actionError}</Alert> : null}
      {members.isError ? (
        <Alert tone="error" title="The members could not be loaded">{members.error.message}</Alert>
      ) : (
        <DataTable columns={memberColumns} data={members.data ?? []} isLoading={members.isPending} getRowId={(m) => m.id} initialSorting={[{ id: "name", desc: false }]} />
      )}
      {canManage ? (
        <>
          <Card>
            <h2 className="mb-3 text-lg font-semibold">Invite someone</h2>
            <InviteForm />
          </Card>
          <section className="space-y-3">
            <h2 className="text-lg font-semibold">Pending invitations</h2>
            <DataTable
              columns={inviteColumns}
              data={invitations.data ?? []}
              isLoading={invitations.isPending}
              getRowId={(i) => i.id}
              emptyState={<p className="p-4 text-sm text-ink-muted">No invitations are waiting.</p>}
            />
          </section>
        </>
      ) : (
        <p className="text-sm text-ink-muted">Only the studio&apos;s owners invite people and change roles.</p>
      )}
      <ConfirmDialog
        open={!!removing}
        title="Remove this member?"
        message={<><strong>{removing?.name}</strong> will lose access to the studio&apos;s projects and takes.</>}
        confirmLabel="Remove"
        danger
        busy={removeMember.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={async () => {
          if (!removing) return;
          try {
            await removeMember.mutateAsync(removing.id);
          } catch (e) {
            setActionError(e instanceof Error ? e.message : "The member could not be removed.");
          }
          setRemoving(null);
        }}
      />
    </div>
  );
}
