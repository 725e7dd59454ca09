"use client";
import { useMemo, useState } from "react";
import {
  Alert,
  Button,
  ConfirmDialog,
  DataTable,
  Dialog,
  EmptyState,
  Mono,
  PageHeader,
  RoleBadge,
  createDataTableColumns,
} from "@/components/ui";
import type { Role } from "@/lib/auth/permissions";
import { CreateApiKeyForm } from "./CreateApiKeyForm";
import { NewKeyDialog } from "./NewKeyDialog";
import type { ApiKeyDto } from "./types";
import { useApiKeys } from "./use-api-keys";
import { useCreateApiKey } from "./use-create-api-key";
import { useRevokeApiKey } from "./use-revoke-api-key";

const col = createDataTableColumns<ApiKeyDto>();
const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

/** The studio's API keys: list, create (shown once), revoke. */
export function ApiKeysView({ studioName, canManage, myRole }: { studioName: string; canManage: boolean; myRole: Role }) {
  const keys = useApiKeys(canManage);
  const create = useCreateApiKey();
  const revoke = useRevokeApiKey();
  const [creating, setCreating] = useState(false);
  const [created, setCreated] = useState<{ key: string; name: string } | null>(null);
  const [revoking, setRevoking] = useState<ApiKeyDto | null>(null);
  const [revokeError, setRevokeError] = useState<string | null>(null);

  const columns = useMemo(
    () =>
      col.columns([
        col.accessor("name", { header: "Name", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
        col.accessor("prefix", { header: "Key", enableSorting: false, cell: (c) => <Mono className="text-ink-muted">{c.getValue()}…</Mono> }),
        col.accessor("role", { header: "Role", cell: (c) => <RoleBadge role={c.getValue()} /> }),
        col.accessor("createdBy", { header: "Created by", cell: (c) => c.getValue() ?? <span className="text-ink-muted">—</span> }),
        col.accessor((k) => new Date(k.createdAt), { id: "createdAt", header: "Created", sortFn: "datetime", cell: (c) => <Mono>{dateFormat.format(c.getValue())}</Mono> }),
        col.accessor((k) => (k.lastUsedAt ? new Date(k.lastUsedAt) : new Date(0)), {
          id: "lastUsedAt",
          header: "Last used",
          sortFn: "datetime",
          cell: ({ row }) => <Mono>{row.original.lastUsedAt ? dateFormat.format(new Date(row.original.lastUsedAt)) : "never"}</Mono>,
        }),
        col.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: ({ row }) => (
            <div className="flex justify-end">
              <Button size="sm" variant="ghost" aria-label={`Revoke ${row.original.name}`} onClick={() => { setRevokeError(null); setRevoking(row.original); }}>
                Revoke
              </Button>
            </div>
          ),
        }),
      ]),
    [],
  );

  const usage = (
    <p className="text-sm text-ink-muted">
      Scripts send a key with each request to <Mono>/api/v1/…</Mono> as{" "}
      <code className="rounded bg-surface px-1 py-0.5 text-[0.8125rem] text-ink">Authorization: Bearer &lt;key&gt;</code>; it acts in{" "}
      {studioName} with the key’s role.
    </p>
  );

  if (!canManage) {
    return (
      <div className="space-y-6">
        <PageHeader title="API keys" description={`Keys let scripts use Tapernote’s API for ${studioName}.`} />
        <Alert tone="info">Only owners and editors manage API keys. Ask one of them if a script of yours needs a key.</Alert>
      </div>
    );
  }

  return (
    <div className="space-y-6">
      <PageHeader
        title="API keys"
        description={`Keys let scripts use Tapernote’s API for ${studioName}.`}
        actions={<Button onClick={() => setCreating(true)}>New API key</Button>}
      />
      {usage}
      {keys.isError ? (
        <Alert tone="error" title="The API keys could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => keys.refetch()}>Try again</Button>}>
          {keys.error.message}
        </Alert>
      ) : (
        <DataTable
          columns={columns}
          data={keys.data ?? []}
          isLoading={keys.isPending}
          getRowId={(k) => k.id}
          caption="API keys"
          initialSorting={[{ id: "createdAt", desc: true }]}
          emptyState={
            <EmptyState
              title="No API keys yet"
              description="Create a key for a script that uploads takes or reads their notes."
              action={<Button onClick={() => setCreating(true)}>New API key</Button>}
            />
          }
        />
      )}

      <Dialog open={creating} onClose={() => setCreating(false)} title="New API key">
        {creating ? (
          <CreateApiKeyForm
            myRole={myRole}
            onCancel={() => setCreating(false)}
            onSubmit={async (input) => {
              const result = await create.mutateAsync(input);
              setCreating(false);
              setCreated({ key: result.key, name: result.apiKey.name });
            }}
          />
        ) : null}
      </Dialog>

      <NewKeyDialog keyText={created?.key ?? null} keyName={created?.name ?? ""} onClose={() => setCreated(null)} />

      <ConfirmDialog
        open={!!revoking}
        title="Revoke this API key?"
        message={
          <>
            Scripts using <strong>{revoking?.name}</strong> (<Mono>{revoking?.prefix}…</Mono>) stop working at once. This cannot be undone.
            {revokeError ? <span className="mt-2 block text-danger" role="alert">{revokeError}</span> : null}
          </>
        }
        confirmLabel="Revoke key"
        danger
        busy={revoke.isPending}
        onCancel={() => setRevoking(null)}
        onConfirm={async () => {
          if (!revoking) return;
          try {
            await revoke.mutateAsync(revoking.id);
            setRevoking(null);
          } catch (e) {
            setRevokeError(e instanceof Error ? e.message : "Revoking failed.");
          }
        }}
      />
    </div>
  );
}
