"use client";
import { Alert, Button, Field, Input, Textarea } from "@/components/ui";
import { useZodForm } from "@/lib/client/use-zod-form";
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
  const { errors, formError, busy, handleSubmit } = useZodForm(createProjectSchema, onSubmit, "Saving failed. Try again.");

  return (
    <form method="post" onSubmit={handleSubmit} noValidate className="space-y-4" aria-label={submitLabel}>
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
