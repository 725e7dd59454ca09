import type { z } from "zod";

export type FormErrors = Record<string, string>;

/** Validates form values with the shared zod schema; returns the data or per-field messages. */
export function validate<S extends z.ZodType>(schema: S, values: unknown):
  | { ok: true; data: z.output<S> }
  | { ok: false; errors: FormErrors } {
  const parsed = schema.safeParse(values);
  if (parsed.success) return { ok: true, data: parsed.data };
  const errors: FormErrors = {};
  for (const issue of parsed.error.issues) {
    const key = issue.path.join(".") || "form";
    errors[key] ??= issue.message;
  }
  return { ok: false, errors };
}

export function formValues(form: HTMLFormElement): Record<string, string> {
  const out: Record<string, string> = {};
  new FormData(form).forEach((v, k) => {
    if (typeof v === "string") out[k] = v;
  });
  return out;
}
