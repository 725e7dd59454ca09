"use client";
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { Alert, Button, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { formValues, validate, type FormErrors } from "@/lib/client/forms";
import { forgotPasswordSchema } from "@/lib/schemas/auth";

export function ForgotPasswordForm() {
  const [errors, setErrors] = useState<FormErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [sent, setSent] = useState(false);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const result = validate(forgotPasswordSchema, formValues(event.currentTarget));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    const { error } = await authClient.requestPasswordReset({ email: result.data.email, redirectTo: "/reset-password" });
    setBusy(false);
    if (error) {
      setFormError(error.status === 429 ? "Too many attempts. Wait a minute and try again." : "The request failed. Try again.");
      return;
    }
    setSent(true);
  }

  if (sent) {
    return (
      <div className="space-y-4" role="status">
        <h1 className="text-xl font-semibold">Check your e-mail</h1>
        <p>If an account uses that address, we have sent it a link to choose a new password. The link works for one hour.</p>
        <Link href="/sign-in" className="text-sm underline underline-offset-2">Back to sign-in</Link>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Reset your password">
      <h1 className="text-xl font-semibold">Forgot your password?</h1>
      <p className="text-sm text-ink-muted">Enter your e-mail address and we will send you a link to choose a new one.</p>
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      <Field label="E-mail" htmlFor="email" error={errors.email}>
        <Input id="email" name="email" type="email" autoComplete="email" invalid={!!errors.email} />
      </Field>
      <Button type="submit" loading={busy} className="w-full">Send the link</Button>
    </form>
  );
}
