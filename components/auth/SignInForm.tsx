"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Alert, Button, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { formValues, validate, type FormErrors } from "@/lib/client/forms";
import { signInSchema } from "@/lib/schemas/auth";

export function SignInForm({ next, notice }: { next: string; notice?: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<FormErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setFormError(null);
    const result = validate(signInSchema, formValues(event.currentTarget));
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    const { error } = await authClient.signIn.email({ ...result.data });
    setBusy(false);
    if (error) {
      if (error.status === 403) setFormError("Confirm your e-mail address first: we have sent you a new link.");
      else if (error.status === 429) setFormError("Too many attempts. Wait a minute and try again.");
      else setFormError("That e-mail address and password do not match an account.");
      return;
    }
    router.replace(next);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label="Sign in">
      <h1 className="text-xl font-semibold">Sign in</h1>
      {notice ? <Alert tone="success">{notice}</Alert> : null}
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      <Field label="E-mail" htmlFor="email" error={errors.email}>
        <Input id="email" name="email" type="email" autoComplete="email" invalid={!!errors.email} />
      </Field>
      <Field label="Password" htmlFor="password" error={errors.password}>
        <Input id="password" name="password" type="password" autoComplete="current-password" invalid={!!errors.password} />
      </Field>
      <Button type="submit" loading={busy} className="w-full">
        Sign in
      </Button>
      <p className="flex justify-between text-sm text-ink-muted">
        <Link href="/forgot-password" className="underline underline-offset-2">Forgot your password?</Link>
        <Link href="/sign-up" className="underline underline-offset-2">Create an account</Link>
      </p>
    </form>
  );
}
