"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Alert, Button, Card, Field, Input } from "@/components/ui";
import { authClient } from "@/lib/client/auth-client";
import { formValues, validate, type FormErrors } from "@/lib/client/forms";
import { changeNameSchema, changePasswordSchema } from "@/lib/schemas/auth";
import { SignOutButton } from "./SignOutButton";

export function AccountForms({ name, email }: { name: string; email: string }) {
  const router = useRouter();
  const [nameErrors, setNameErrors] = useState<FormErrors>({});
  const [nameSaved, setNameSaved] = useState(false);
  const [pwErrors, setPwErrors] = useState<FormErrors>({});
  const [pwMessage, setPwMessage] = useState<{ tone: "success" | "error"; text: string } | null>(null);
  const [busy, setBusy] = useState<"name" | "password" | null>(null);

  async function saveName(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setNameSaved(false);
    const result = validate(changeNameSchema, formValues(event.currentTarget));
    if (!result.ok) return setNameErrors(result.errors);
    setNameErrors({});
    setBusy("name");
    const { error } = await authClient.updateUser({ name: result.data.name });
    setBusy(null);
    if (error) return setNameErrors({ name: "The name could not be saved. Try again." });
    setNameSaved(true);
    router.refresh();
  }

  async function savePassword(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    setPwMessage(null);
    const result = validate(changePasswordSchema, formValues(form));
    if (!result.ok) return setPwErrors(result.errors);
    setPwErrors({});
    setBusy("password");
    const { error } = await authClient.changePassword({ ...result.data, revokeOtherSessions: true });
    setBusy(null);
    if (error) {
      if (error.status === 400 || error.status === 401) setPwErrors({ currentPassword: "This is not your current password." });
      else setPwMessage({ tone: "error", text: "The password could not be changed. Try again." });
      return;
    }
    form.reset();
    setPwMessage({ tone: "success", text: "Password changed. Other devices have been signed out." });
  }

  return (
    <div className="grid gap-6 md:grid-cols-2">
      <Card>
        <form onSubmit={saveName} noValidate className="space-y-4" aria-label="Your name">
          <h2 className="text-lg font-semibold">Profile</h2>
          <Field label="E-mail" htmlFor="account-email" hint="Your sign-in address.">
            <Input id="account-email" value={email} readOnly disabled />
          </Field>
          <Field label="Name" htmlFor="account-name" error={nameErrors.name}>
            <Input id="account-name" name="name" defaultValue={name} invalid={!!nameErrors.name} />
          </Field>
          {nameSaved ? <Alert tone="success">Saved.</Alert> : null}
          <Button type="submit" loading={busy === "name"}>Save name</Button>
        </form>
      </Card>
      <Card>
        <form onSubmit={savePassword} noValidate className="space-y-4" aria-label="Change password">
          <h2 className="text-lg font-semibold">Password</h2>
          <Field label="Current password" htmlFor="current-password" error={pwErrors.currentPassword}>
            <Input id="current-password" name="currentPassword" type="password" autoComplete="current-password" invalid={!!pwErrors.currentPassword} />
          </Field>
          <Field label="New password" htmlFor="new-password" error={pwErrors.newPassword} hint="At least 8 characters.">
            <Input id="new-password" name="newPassword" type="password" autoComplete="new-password" invalid={!!pwErrors.newPassword} />
          </Field>
          {pwMessage ? <Alert tone={pwMessage.tone}>{pwMessage.text}</Alert> : null}
          <Button type="submit" loading={busy === "password"}>Change password</Button>
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
