"use client";
import { useState } from "react";
import { Alert, Button, ConfirmDialog, Field, Input, Mono, Select, Spinner } from "@/components/ui";
import { ApiClientError, firstErrors } from "@/lib/client/api";
import { validate } from "@/lib/client/forms";
import { newShareLinkSchema } from "@/lib/schemas/comments";
import { useCreateShareLink } from "./use-create-share-link";
import { useRevokeShareLink } from "./use-revoke-share-link";
import { useShareLinks } from "./use-share-links";

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });
const DAYS = [1, 7, 14, 30, 90];

/** Read-only links to the replay page, for students without an account (editors). */
export function ShareLinks({ takeId }: { takeId: string }) {
  const links = useShareLinks(takeId);
  const create = useCreateShareLink(takeId);
  const revoke = useRevokeShareLink(takeId);
  const [days, setDays] = useState("14");
  const [error, setError] = useState<string | undefined>();
  const [made, setMade] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const [revoking, setRevoking] = useState<string | null>(null);
  const [revokeError, setRevokeError] = useState<string | null>(null);

  const submit = async () => {
    const checked = validate(newShareLinkSchema, { expiresInDays: Number(days) });
    if (!checked.ok) return setError(checked.errors.expiresInDays ?? checked.errors.form);
    setError(undefined);
    setCopied(false);
    try {
      const { url } = await create.mutateAsync(checked.data.expiresInDays);
      setMade(url);
    } catch (e) {
      setError(e instanceof ApiClientError ? (firstErrors(e.fields).expiresInDays ?? e.message) : "The link could not be made.");
    }
  };

  return (
    <div className="space-y-4">
      <form
        className="flex flex-wrap items-end gap-3"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          void submit();
        }}
      >
        <Field label="Link expires after" htmlFor="share-days" error={error}>
          <Select value={days} onChange={(e) => setDays(e.target.value)} wrapperClassName="w-40">
            {DAYS.map((d) => (
              <option key={d} value={d}>{d === 1 ? "1 day" : `${d} days`}</option>
            ))}
          </Select>
        </Field>
        <Button type="submit" loading={create.isPending}>Create share link</Button>
      </form>
      {made ? (
        <Alert tone="success" title="Share link made: copy it now, it is shown only once">
          <div className="mt-2 flex flex-wrap items-center gap-2">
            <Input readOnly value={made} className="min-w-0 flex-1 font-mono text-sm" aria-label="Share link" data-testid="new-share-link" onFocus={(e) => e.currentTarget.select()} />
            <Button
              size="sm"
              variant="secondary"
              onClick={async () => {
                try {
                  await navigator.clipboard.writeText(made);
                  setCopied(true);
                } catch {
                  setCopied(false);
                }
              }}
            >
              {copied ? "Copied" : "Copy"}
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setMade(null)}>Done</Button>
          </div>
          <p className="mt-1 text-xs">Anyone with the link can replay this take and read its comments, without an account, until it expires or you withdraw it.</p>
        </Alert>
      ) : null}
      {links.isPending ? (
        <Spinner size="sm" label="Loading the share links" />
      ) : links.isError ? (
        <Alert tone="error" title="The share links could not be loaded">{links.error.message}</Alert>
      ) : links.data.length === 0 ? (
        <p className="text-sm text-ink-muted">No share links yet.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-md border border-rule" aria-label="Share links">
          {links.data.map((l) => {
            const expired = Date.parse(l.expiresAt) < Date.now();
            const by = typeof l.createdBy === "string" ? l.createdBy : l.createdBy?.name;
            return (
              <li key={l.id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2 text-sm" data-testid="share-link-row">
                <span>
                  {expired ? "Expired" : "Expires"} <Mono>{dateFormat.format(new Date(l.expiresAt))}</Mono>
                  <span className="text-ink-muted"> · made <Mono>{dateFormat.format(new Date(l.createdAt))}</Mono>{by ? ` by ${by}` : ""}</span>
                </span>
                <Button size="sm" variant="secondary" onClick={() => { setRevokeError(null); setRevoking(l.id); }}>Withdraw</Button>
              </li>
            );
          })}
        </ul>
      )}
      <ConfirmDialog
        open={revoking !== null}
        title="Withdraw this share link?"
        message={<>Whoever has the link can no longer open the take.{revokeError ? <span className="mt-2 block text-danger" role="alert">{revokeError}</span> : null}</>}
        confirmLabel="Withdraw link"
        danger
        busy={revoke.isPending}
        onCancel={() => setRevoking(null)}
        onConfirm={async () => {
          try {
            await revoke.mutateAsync(revoking!);
            setRevoking(null);
          } catch (e) {
            setRevokeError(e instanceof Error ? e.message : "Withdrawing failed.");
          }
        }}
      />
    </div>
  );
}
