"use client";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Alert, Button, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { FormFailure, useZodForm } from "@/lib/client/use-zod-form";
import { resetPasswordSchema } from "@/lib/schemas/auth";

export function ResetPasswordForm({ token }: { token: string | null }) {
  const router = useRouter();
  const { errors, formError, busy, handleSubmit } = useZodForm(
    resetPasswordSchema,
    async (data) => {
      const { error } = await authClient.resetPassword({ newPassword: data.password, token: token! });
      if (error) throw new FormFailure("The reset link is invalid or has expired. Ask for a new one.");
      router.replace("/sign-in?notice=reset");
    },
    "The password could not be saved. Try again.",
  );

  if (!token) {
    return (
      <div className="space-y-4">
        <h1 className="text-xl font-semibold">This link does not work</h1>
        <Alert tone="error">The reset link is invalid or has expired.</Alert>
        <Link href="/forgot-password" className="text-sm underline underline-offset-2">Ask for a new link</Link>
      </div>
    );
  }

  return (
    <form method="post" onSubmit={handleSubmit} noValidate className="space-y-4" aria-label="Choose a new password">
      <h1 className="text-xl font-semibold">Choose a new password</h1>
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      <Field label="New password" htmlFor="password" error={errors.password} hint="At least 8 characters.">
        <Input id="password" name="password" type="password" autoComplete="new-password" invalid={!!errors.password} />
      </Field>
      <Field label="The same again" htmlFor="confirm" error={errors.confirm}>
        <Input id="confirm" name="confirm" type="password" autoComplete="new-password" invalid={!!errors.confirm} />
      </Field>
      <Button type="submit" loading={busy} className="w-full">Save the new password</Button>
    </form>
  );
}
