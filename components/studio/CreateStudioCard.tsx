"use client";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { Button, Card, Field, Input } from "@/components/ui";
import { ApiClientError, apiFetch, firstErrors } from "@/lib/client/api";
import { validate } from "@/lib/client/forms";
import { studioNameSchema } from "@/lib/schemas/members";

/** Shown to a signed-in person who belongs to no studio. */
export function CreateStudioCard() {
  const router = useRouter();
  const [error, setError] = useState<string | undefined>();
  const [busy, setBusy] = useState(false);
  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const result = validate(studioNameSchema, { name: new FormData(event.currentTarget).get("name") });
    if (!result.ok) return setError(result.errors.name);
    setBusy(true);
    try {
      await apiFetch("/api/v1/studios", { method: "POST", json: result.data });
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiClientError ? (firstErrors(e.fields).name ?? e.message) : "Could not create the studio.");
    } finally {
      setBusy(false);
    }
  }
  return (
    <Card className="mx-auto max-w-md">
      <form method="post" onSubmit={submit} noValidate className="space-y-4">
        <h1 className="text-xl font-semibold">You are not in a studio</h1>
        <p className="text-sm text-ink-muted">Ask a studio owner for an invitation, or start a studio of your own.</p>
        <Field label="Studio name" htmlFor="new-studio-name" error={error}>
          <Input id="new-studio-name" name="name" invalid={!!error} />
        </Field>
        <Button type="submit" loading={busy}>Create studio</Button>
      </form>
    </Card>
  );
}
