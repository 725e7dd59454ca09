"use client";
import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button, Dialog, Field, Input, Select } from "@/components/ui";
import { ApiClientError, apiFetch, firstErrors } from "@/lib/client/api";
import { studioNameSchema } from "@/lib/schemas/members";
import { validate } from "@/lib/client/forms";

type StudioOption = { id: string; name: string; role: string };

/** Chooses the studio the session acts in; every page and API call follows it. */
export function StudioSwitcher({ studios, activeId }: { studios: StudioOption[]; activeId: string }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [busy, setBusy] = useState(false);
  const [creating, setCreating] = useState(false);
  const [nameError, setNameError] = useState<string | undefined>();

  async function choose(studioId: string) {
    if (studioId === "__new") return setCreating(true);
    setBusy(true);
    try {
      await apiFetch("/api/v1/studio/active", { method: "PUT", json: { studioId } });
      queryClient.clear();
      router.refresh();
    } finally {
      setBusy(false);
    }
  }

  async function create(form: HTMLFormElement) {
    const result = validate(studioNameSchema, { name: new FormData(form).get("name") });
    if (!result.ok) return setNameError(result.errors.name);
    setBusy(true);
    try {
      await apiFetch("/api/v1/studios", { method: "POST", json: result.data });
      setCreating(false);
      queryClient.clear();
      router.push("/projects");
      router.refresh();
    } catch (e) {
      setNameError(e instanceof ApiClientError ? (firstErrors(e.fields).name ?? e.message) : "Could not create the studio.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <>
      <label className="flex items-center gap-2 text-sm">
        <span className="text-ink-muted">Studio</span>
        <Select
          aria-label="Active studio"
          value={activeId}
          disabled={busy}
          onChange={(e) => void choose(e.target.value)}
          className="max-w-56"
        >
          {studios.map((s) => (
            <option key={s.id} value={s.id}>
              {s.name} ({s.role})
            </option>
          ))}
          <option value="__new">New studio…</option>
        </Select>
      </label>
      <Dialog open={creating} onClose={() => setCreating(false)} title="New studio">
        <form
          noValidate
          className="space-y-4"
          onSubmit={(e) => {
            e.preventDefault();
            void create(e.currentTarget);
          }}
        >
          <p className="text-sm text-ink-muted">You will be the owner. Invite teachers and students from the Members page.</p>
          <Field label="Studio name" htmlFor="studio-name" error={nameError}>
            <Input id="studio-name" name="name" autoFocus invalid={!!nameError} />
          </Field>
          <div className="flex justify-end gap-2">
            <Button type="button" variant="secondary" onClick={() => setCreating(false)}>Cancel</Button>
            <Button type="submit" loading={busy}>Create studio</Button>
          </div>
        </form>
      </Dialog>
    </>
  );
}
