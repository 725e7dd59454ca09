"use client";
import { Alert, Button, Field, Input, Select } from "@/components/ui";
import { useZodForm } from "@/lib/client/use-zod-form";
import { ROLES, ROLE_DESCRIPTION, ROLE_LABEL, ROLE_RANK, type Role } from "@/lib/auth/permissions";
import { createApiKeySchema, type CreateApiKeyInput } from "./types";

/** Name and role of a new key; only roles no higher than the creator's own are offered. */
export function CreateApiKeyForm({
  myRole,
  onSubmit,
  onCancel,
}: {
  myRole: Role;
  onSubmit: (input: CreateApiKeyInput) => Promise<unknown>;
  onCancel: () => void;
}) {
  const roles = ROLES.filter((r) => ROLE_RANK[r] <= ROLE_RANK[myRole]);
  const { errors, formError, busy, handleSubmit } = useZodForm(createApiKeySchema, onSubmit, "The key could not be created.");

  return (
    <form method="post" onSubmit={handleSubmit} noValidate className="space-y-4" aria-label="Create API key">
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      <Field label="Name" htmlFor="api-key-name" error={errors.name} hint="What the key is for, e.g. “Nightly export script”.">
        <Input name="name" autoFocus maxLength={80} />
      </Field>
      <Field label="Role" htmlFor="api-key-role" error={errors.role} hint="What a script with this key may do. No higher than your own role.">
        <Select name="role" defaultValue={roles.includes("editor") ? "editor" : roles[0]}>
          {roles.map((r) => (
            <option key={r} value={r}>{ROLE_LABEL[r]} — {ROLE_DESCRIPTION[r].toLowerCase()}</option>
          ))}
        </Select>
      </Field>
      <div className="flex justify-end gap-2">
        <Button type="button" variant="secondary" onClick={onCancel}>Cancel</Button>
        <Button type="submit" loading={busy}>Create key</Button>
      </div>
    </form>
  );
}
