"use client";
import { useState, type FormEvent } from "react";
import { Alert, Button, Field, Input, Textarea } from "@/components/ui";
import { ApiClientError, firstErrors } from "@/lib/client/api";
import { formValues, validate, type FormErrors } from "@/lib/client/forms";
import { createProjectSchema, type CreateProjectInput } from "@/lib/schemas/project";

/** Create or rename a project; the shared zod schema checks it here and again on the server. */
export function ProjectForm({
  initial,
  submitLabel,
  onSubmit,
  onCancel,
}: {
  initial?: { name: string; description: string };
  submitLabel: string;
  onSubmit: (input: CreateProjectInput) => Promise<unknown>;
  onCancel: () => void;
}) {
  const [errors, setErrors] = useState<FormErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setFormError(null);
    const result = validate(createProjectSchema, formValues(event.currentTarget));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    try {
      await onSubmit(result.data);
    } catch (e) {
      if (e instanceof ApiClientError && e.fields) setErrors(firstErrors(e.fields));
      else setFormError(e instanceof Error ? e.message : "Saving failed. Try again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label={submitLabel}>
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      <Field label="Name" htmlFor="project-name" error={errors.name}>
        <Input id="project-name" name="name" defaultValue={initial?.name} autoFocus invalid={!!errors.name} maxLength={120} />
      </Field>
      <Field label="Description" htmlFor="project-description" error={errors.description} hint="Optional.">
        <Textarea id="project-description" name="description" defaultValue={initial?.description} rows={3} invalid={!!errors.description} />
      </Field>
      <div className="flex justify-end gap-2">
        <Button type="button" variant="secondary" onClick={onCancel}>Cancel</Button>
        <Button type="submit" loading={busy}>{submitLabel}</Button>
      </div>
    </form>
  );
}
