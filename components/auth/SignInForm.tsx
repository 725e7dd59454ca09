"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Alert, Button, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { FormFailure, TOO_MANY_ATTEMPTS, useZodForm } from "@/lib/client/use-zod-form";
import { signInSchema } from "@/lib/schemas/auth";

export function SignInForm({ next, notice }: { next: string; notice?: string }) {
  const router = useRouter();
  const { errors, formError, busy, handleSubmit } = useZodForm(
    signInSchema,
    async (data) => {
      const { error } = await authClient.signIn.email({ ...data });
      if (error) {
        if (error.status === 403) throw new FormFailure("Confirm your e-mail address first: we have sent you a new link.");
        if (error.status === 429) throw new FormFailure(TOO_MANY_ATTEMPTS);
        throw new FormFailure("That e-mail address and password do not match an account.");
      }
      router.replace(next);
      router.refresh();
    },
    "Signing in failed. Try again.",
  );

  return (
    <form method="post" onSubmit={handleSubmit} noValidate className="space-y-4" aria-label="Sign in">
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
