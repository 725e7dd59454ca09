"use client";
import { useState, type FormEvent } from "react";
import type { z } from "zod";
import { ApiClientError, firstErrors } from "./api";
import { formValues, validate, type FormErrors } from "./forms";

/**
 * The submit cycle of a form checked with a shared zod schema: validate in the browser,
 * call the server, and show its field errors next to the fields (or one form-level message).
 */
export function useZodForm<S extends z.ZodType>(schema: S, onValid: (data: z.output<S>) => Promise<unknown>, failedMessage: string) {
  const [errors, setErrors] = useState<FormErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setFormError(null);
    const result = validate(schema, formValues(event.currentTarget));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    try {
      await onValid(result.data);
    } catch (e) {
      if (e instanceof ApiClientError && e.fields) setErrors(firstErrors(e.fields));
      else setFormError(e instanceof Error ? e.message : failedMessage);
    } finally {
      setBusy(false);
    }
  }

  return { errors, formError, busy, handleSubmit };
}
