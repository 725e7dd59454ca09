"use client";
import { useState, type FormEvent } from "react";
import { Alert, Button, Field, Input, Select } from "@/components/ui";
import { ApiClientError, firstErrors } from "@/lib/client/api";
import { formValues, validate, type FormErrors } from "@/lib/client/forms";
import { ROLES, ROLE_DESCRIPTION, ROLE_LABEL } from "@/lib/auth/permissions";
import { inviteSchema } from "@/lib/schemas/members";
import { useInvite } from "./use-invite";

export function InviteForm() {
  const invite = useInvite();
  const [errors, setErrors] = useState<FormErrors>({});
  const [sent, setSent] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setSent(null);
    setFormError(null);
    const result = validate(inviteSchema, formValues(form));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    try {
      await invite.mutateAsync(result.data);
      setSent(result.data.email);
      form.reset();
    } catch (e) {
      if (e instanceof ApiClientError && e.fields) setErrors(firstErrors(e.fields));
      else setFormError(e instanceof Error ? e.message : "The invitation could not be sent.");
    }
  }

  return (
    <form method="post" onSubmit={submit} noValidate className="space-y-3" aria-label="Invite someone">
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem_auto] sm:items-start">
        <Field label="E-mail" htmlFor="invite-email" error={errors.email}>
          <Input id="invite-email" name="email" type="email" invalid={!!errors.email} placeholder="name@example.org" />
        </Field>
        <Field label="Role" htmlFor="invite-role" error={errors.role}>
          <Select id="invite-role" name="role" defaultValue="listener" invalid={!!errors.role}>
            {ROLES.map((r) => (
              <option key={r} value={r}>{ROLE_LABEL[r]} — {ROLE_DESCRIPTION[r]}</option>
            ))}
          </Select>
        </Field>
        <Button type="submit" loading={invite.isPending} className="sm:mt-6">Send invitation</Button>
      </div>
      <p className="text-xs text-ink-muted">
        Students are often minors: invite them as listeners, with their or their guardian&apos;s consent. Local data-protection rules apply.
      </p>
      {sent ? <Alert tone="success">Invitation sent to {sent}.</Alert> : null}
      {formError ? <Alert tone="error">{formError}</Alert> : null}
    </form>
  );
}
