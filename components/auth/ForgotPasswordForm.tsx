"use client";
import Link from "next/link";
import { useState } from "react";
import { Alert, Button, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { FormFailure, TOO_MANY_ATTEMPTS, useZodForm } from "@/lib/client/use-zod-form";
import { forgotPasswordSchema } from "@/lib/schemas/auth";

export function ForgotPasswordForm() {
  const [sent, setSent] = useState(false);
  const { errors, formError, busy, handleSubmit } = useZodForm(
    forgotPasswordSchema,
    async (data) => {
      const { error } = await authClient.requestPasswordReset({ email: data.email, redirectTo: "/reset-password" });
      if (error) throw new FormFailure(error.status === 429 ? TOO_MANY_ATTEMPTS : "The request failed. Try again.");
      setSent(true);
    },
    "The request failed. Try again.",
  );

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
    <form method="post" onSubmit={handleSubmit} noValidate className="space-y-4" aria-label="Reset your password">
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
