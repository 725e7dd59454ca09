"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Alert, Button, Card, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { FormFailure, useZodForm } from "@/lib/client/use-zod-form";
import { changeNameSchema, changePasswordSchema } from "@/lib/schemas/auth";
import { SignOutButton } from "./SignOutButton";

export function AccountForms({ name, email }: { name: string; email: string }) {
  const router = useRouter();
  const [nameSaved, setNameSaved] = useState(false);
  const [passwordChanged, setPasswordChanged] = useState(false);
  const nameForm = useZodForm(
    changeNameSchema,
    async (data) => {
      setNameSaved(false);
      const { error } = await authClient.updateUser({ name: data.name });
      if (error) throw new FormFailure({ name: "The name could not be saved. Try again." });
      setNameSaved(true);
      router.refresh();
    },
    "The name could not be saved. Try again.",
  );
  const passwordForm = useZodForm(
    changePasswordSchema,
    async (data, form) => {
      setPasswordChanged(false);
      const { error } = await authClient.changePassword({ ...data, revokeOtherSessions: true });
      if (error) {
        if (error.status === 400 || error.status === 401) throw new FormFailure({ currentPassword: "This is not your current password." });
        throw new FormFailure("The password could not be changed. Try again.");
      }
      form.reset();
      setPasswordChanged(true);
    },
    "The password could not be changed. Try again.",
  );
  const nameErrors = nameForm.errors;
  const pwErrors = passwordForm.errors;

  return (
    <div className="grid gap-6 md:grid-cols-2">
      <Card>
        <form method="post" onSubmit={nameForm.handleSubmit} noValidate className="space-y-4" aria-label="Your name">
          <h2 className="text-lg font-semibold">Profile</h2>
          <Field label="E-mail" htmlFor="account-email" hint="Your sign-in address.">
            <Input id="account-email" value={email} readOnly disabled />
          </Field>
          <Field label="Name" htmlFor="account-name" error={nameErrors.name}>
            <Input id="account-name" name="name" defaultValue={name} invalid={!!nameErrors.name} />
          </Field>
          {nameForm.formError ? <Alert tone="error">{nameForm.formError}</Alert> : null}
          {nameSaved ? <Alert tone="success">Saved.</Alert> : null}
          <Button type="submit" loading={nameForm.busy}>Save name</Button>
        </form>
      </Card>
      <Card>
        <form method="post" onSubmit={passwordForm.handleSubmit} noValidate className="space-y-4" aria-label="Change password">
          <h2 className="text-lg font-semibold">Password</h2>
          <Field label="Current password" htmlFor="current-password" error={pwErrors.currentPassword}>
            <Input id="current-password" name="currentPassword" type="password" autoComplete="current-password" invalid={!!pwErrors.currentPassword} />
          </Field>
          <Field label="New password" htmlFor="new-password" error={pwErrors.newPassword} hint="At least 8 characters.">
            <Input id="new-password" name="newPassword" type="password" autoComplete="new-password" invalid={!!pwErrors.newPassword} />
          </Field>
          {passwordForm.formError ? <Alert tone="error">{passwordForm.formError}</Alert> : null}
          {passwordChanged ? <Alert tone="success">Password changed. Other devices have been signed out.</Alert> : null}
          <Button type="submit" loading={passwordForm.busy}>Change password</Button>
        </form>
      </Card>
      <Card className="md:col-span-2">
        <h2 className="mb-2 text-lg font-semibold">Session</h2>
        <p className="mb-3 text-sm text-ink-muted">Signing out ends this session on this device.</p>
        <SignOutButton variant="secondary" />
      </Card>
    </div>
  );
}
