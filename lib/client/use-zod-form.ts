"use client";
import { useState, type FormEvent } from "react";
import type { z } from "zod";
import { ApiClientError, firstErrors } from "./api";
import { formValues, validate, type FormErrors } from "./forms";

/**
 * What a form's submit step throws to show a failure: field errors next to their fields, or
 * one message above the form. For calls that report errors as values (the auth client).
 */
export class FormFailure extends Error {
  readonly fields: FormErrors;
  constructor(failure: string | FormErrors) {
    super(typeof failure === "string" ? failure : Object.values(failure)[0] ?? "");
    this.fields = typeof failure === "string" ? {} : failure;
  }
}

/** The message for an auth endpoint's 429 (rate limit), the same on every form. */
export const TOO_MANY_ATTEMPTS = "Too many attempts. Wait a minute and try again.";

/**
 * The submit cycle of a form checked with a shared zod schema: validate in the browser,
 * call the server, and show its field errors next to the fields (or one form-level message).
 * `onValid` gets the parsed values and the form element (to reset it after success).
 */
export function useZodForm<S extends z.ZodType>(
  schema: S,
  onValid: (data: z.output<S>, form: HTMLFormElement) => Promise<unknown>,
  failedMessage: string,
) {
  const [errors, setErrors] = useState<FormErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function handleSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setFormError(null);
    const result = validate(schema, formValues(form));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    try {
      await onValid(result.data, form);
    } catch (e) {
      if (e instanceof FormFailure && Object.keys(e.fields).length > 0) setErrors(e.fields);
      else if (e instanceof ApiClientError && e.fields) setErrors(firstErrors(e.fields));
      else setFormError(e instanceof Error && e.message ? e.message : failedMessage);
    } finally {
      setBusy(false);
    }
  }

  return { errors, formError, busy, handleSubmit };
}
