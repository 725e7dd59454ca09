"use client";
import { useRef, useState } from "react";
import { Alert, Button, ConfirmDialog, Field, Mono, Select, Spinner } from "@/components/ui";
import { ApiClientError, firstErrors } from "@/lib/client/api";
import { useTakes } from "@/components/takes/use-takes";
import { AssignmentResult } from "./AssignmentResult";
import { useAssignment } from "./use-assignment";
import { useDeleteAssignment } from "./use-delete-assignment";
import { useSetAssignment } from "./use-set-assignment";

const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });
const FORMAT_LABEL = { midi: "MIDI file", musicxml: "MusicXML file", take: "another take’s notes" } as const;

function errorOf(e: unknown, field: string): string {
  if (e instanceof ApiClientError) return firstErrors(e.fields)[field] ?? e.message;
  return e instanceof Error ? e.message : "That did not work.";
}

/** The expected notes of the exercise and how this take compares with them. */
export function AssignmentPanel({ takeId, projectId, canEdit }: { takeId: string; projectId: string; canEdit: boolean }) {
  const assignment = useAssignment(takeId);
  const set = useSetAssignment(takeId);
  const remove = useDeleteAssignment(takeId);
  const takes = useTakes(projectId);
  const fileRef = useRef<HTMLInputElement>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  const [fromTake, setFromTake] = useState("");
  const [takeError, setTakeError] = useState<string | undefined>();
  const [replacing, setReplacing] = useState(false);
  const [removing, setRemoving] = useState(false);

  const others = (takes.data ?? []).filter((t) => t.id !== takeId);
  const showForm = canEdit && (replacing || assignment.data === null);

  return (
    <div className="space-y-4">
      {assignment.isPending ? (
        <Spinner size="sm" label="Loading the assignment" />
      ) : assignment.isError ? (
        <Alert tone="error" title="The assignment could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => assignment.refetch()}>Try again</Button>}>{assignment.error.message}</Alert>
      ) : assignment.data ? (
        <>
          <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
            <p>
              <span className="font-semibold">{assignment.data.assignment.name}</span>{" "}
              <span className="text-ink-muted">· {FORMAT_LABEL[assignment.data.assignment.sourceFormat]} · <Mono>{assignment.data.assignment.noteCount}</Mono> notes · attached <Mono>{dateFormat.format(new Date(assignment.data.assignment.createdAt))}</Mono></span>
            </p>
            {canEdit ? (
              <span className="flex gap-2">
                <Button size="sm" variant="secondary" onClick={() => setReplacing((v) => !v)}>{replacing ? "Keep this one" : "Replace"}</Button>
                <Button size="sm" variant="ghost" onClick={() => setRemoving(true)}>Remove</Button>
              </span>
            ) : null}
          </div>
          <AssignmentResult data={assignment.data} />
        </>
      ) : (
        <p className="text-sm text-ink-muted">{canEdit ? "No assignment yet: attach the exercise’s expected notes to see which were played, missed, extra or off-pitch." : "No assignment for this take."}</p>
      )}

      {showForm ? (
        <div className="grid gap-4 border-t border-rule pt-4 sm:grid-cols-2">
          <form
            className="space-y-2"
            noValidate
            onSubmit={async (e) => {
              e.preventDefault();
              const file = fileRef.current?.files?.[0];
              if (!file) return setFileError("Choose a MIDI or MusicXML file.");
              setFileError(undefined);
              try {
                await set.mutateAsync({ file });
                setReplacing(false);
                if (fileRef.current) fileRef.current.value = "";
              } catch (err) {
                setFileError(errorOf(err, "file"));
              }
            }}
          >
            <Field label="From a file" htmlFor="assignment-file" hint="A Standard MIDI File (.mid) or MusicXML (.musicxml, .xml)." error={fileError}>
              <input
                ref={fileRef}
                type="file"
                accept=".mid,.midi,.musicxml,.xml,audio/midi,audio/x-midi,application/vnd.recordare.musicxml+xml,application/xml,text/xml"
                className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-rule file:bg-surface file:px-3 file:py-1.5 file:text-sm"
                aria-invalid={fileError ? true : undefined}
                aria-describedby={fileError ? "assignment-file-error" : "assignment-file-hint"}
                id="assignment-file"
              />
            </Field>
            <Button type="submit" size="sm" loading={set.isPending && set.variables !== undefined && "file" in set.variables}>Attach file</Button>
          </form>
          <form
            className="space-y-2"
            noValidate
            onSubmit={async (e) => {
              e.preventDefault();
              if (!fromTake) return setTakeError("Choose a take.");
              setTakeError(undefined);
              try {
                await set.mutateAsync({ fromTakeId: fromTake });
                setReplacing(false);
              } catch (err) {
                setTakeError(errorOf(err, "fromTakeId"));
              }
            }}
          >
            <Field label="Use another take’s notes" htmlFor="assignment-take" hint="e.g. the teacher’s own take of the exercise." error={takeError}>
              <Select value={fromTake} onChange={(e) => setFromTake(e.target.value)}>
                <option value="">{takes.isPending ? "Loading the takes…" : others.length ? "Choose a take…" : "No other takes in this project"}</option>
                {others.map((t) => (
                  <option key={t.id} value={t.id} disabled={t.analysis?.state !== "ready"}>
                    {t.name}{t.analysis?.state !== "ready" ? " (no notes yet)" : ""}
                  </option>
                ))}
              </Select>
            </Field>
            <Button type="submit" size="sm" loading={set.isPending && set.variables !== undefined && "fromTakeId" in set.variables}>Use these notes</Button>
          </form>
        </div>
      ) : null}

      <ConfirmDialog
        open={removing}
        title="Remove the assignment?"
        message={<>The expected notes are removed from this take; the take itself is kept.{remove.isError ? <span className="mt-2 block text-danger" role="alert">{remove.error.message}</span> : null}</>}
        confirmLabel="Remove assignment"
        danger
        busy={remove.isPending}
        onCancel={() => setRemoving(false)}
        onConfirm={async () => {
          try {
            await remove.mutateAsync();
            setRemoving(false);
          } catch {
            // shown in the dialog
          }
        }}
      />
    </div>
  );
}
