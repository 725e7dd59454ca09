"use client";
import Link from "next/link";
import { useState } from "react";
import { Alert, Button, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { FormFailure, TOO_MANY_ATTEMPTS, useZodForm } from "@/lib/client/use-zod-form";
import { signUpSchema } from "@/lib/schemas/auth";

export function SignUpForm({ showDevMailbox }: { showDevMailbox: boolean }) {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { errors, formError, busy, handleSubmit } = useZodForm(
    signUpSchema,
    async (data) => {
      const { error } = await authClient.signUp.email({ ...data, callbackURL: "/projects" });
      if (error) {
        if (error.status === 422 || /exist/i.test(error.message ?? "")) throw new FormFailure({ email: "An account with this e-mail address already exists." });
        if (error.status === 429) throw new FormFailure(TOO_MANY_ATTEMPTS);
        throw new FormFailure(error.message ?? "The account could not be created. Try again.");
      }
      setSentTo(data.email);
    },
    "The account could not be created. Try again.",
  );

  if (sentTo) {
    return (
      <div className="space-y-4" role="status">
        <h1 className="text-xl font-semibold">Check your e-mail</h1>
        <p>
          We sent a link to <strong>{sentTo}</strong>. Open it to confirm your address and start using Tapernote.
        </p>
        {showDevMailbox ? (
          <Alert tone="info">
            This is a development server: the message is in the{" "}
            <a href="/dev/mailbox" className="underline underline-offset-2">development mailbox</a>.
          </Alert>
        ) : null}
      </div>
    );
  }

  return (
    <form method="post" onSubmit={handleSubmit} noValidate className="space-y-4" aria-label="Create an account">
      <h1 className="text-xl font-semibold">Create an account</h1>
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      <Field label="Your name" htmlFor="name" error={errors.name}>
        <Input id="name" name="name" autoComplete="name" invalid={!!errors.name} />
      </Field>
      <Field label="E-mail" htmlFor="email" error={errors.email}>
        <Input id="email" name="email" type="email" autoComplete="email" invalid={!!errors.email} />
      </Field>
      <Field label="Password" htmlFor="password" error={errors.password} hint="At least 8 characters.">
        <Input id="password" name="password" type="password" autoComplete="new-password" invalid={!!errors.password} />
      </Field>
      <Button type="submit" loading={busy} className="w-full">
        Create account
      </Button>
      <p className="text-sm text-ink-muted">
        Already have an account? <Link href="/sign-in" className="underline underline-offset-2">Sign in</Link>
      </p>
    </form>
  );
}
