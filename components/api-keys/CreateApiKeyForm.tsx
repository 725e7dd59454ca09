"use client";
import { useState, type FormEvent } from "react";
import { Alert, Button, Field, Input, Select } from "@/components/ui";
import { ApiClientError, firstErrors } from "@/lib/client/api";
import { formValues, validate, type FormErrors } from "@/lib/client/forms";
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
  const [errors, setErrors] = useState<FormErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setFormError(null);
    const result = validate(createApiKeySchema, formValues(event.currentTarget));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    try {
      await onSubmit(result.data);
    } catch (e) {
      if (e instanceof ApiClientError && e.fields) setErrors(firstErrors(e.fields));
      setFormError(e instanceof Error ? e.message : "The key could not be created.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Create API key">
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
