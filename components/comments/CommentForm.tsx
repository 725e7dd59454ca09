"use client";
import { useState } from "react";
import { Button, Field, Input, Select, Textarea } from "@/components/ui";
import { firstErrors, ApiClientError } from "@/lib/client/api";
import { validate, type FormErrors } from "@/lib/client/forms";
import { midiToNoteName } from "@/lib/music/pitch";
import { newCommentSchema } from "@/lib/schemas/comments";
import { formatClock } from "@/components/report/format";
import type { CommentTarget } from "./types";
import { useAddComment } from "./use-add-comment";

export type PickableNote = { onsetSec: number; offsetSec: number; pitch: number; voice: number };

/** Field errors from the API, under the form's own field names. */
function apiErrors(e: unknown): FormErrors {
  if (!(e instanceof ApiClientError)) return { form: e instanceof Error ? e.message : "Saving failed." };
  const fields = firstErrors(e.fields);
  const out: FormErrors = {};
  for (const [k, v] of Object.entries(fields)) out[k.replace(/^target\./, "")] = v;
  if (Object.keys(out).length === 0) out.form = e.message;
  return out;
}

/** A new comment on the whole take, a time range or one note (teachers). */
export function NewCommentForm({ takeId, notes, idPrefix = "comment" }: { takeId: string; notes: PickableNote[]; idPrefix?: string }) {
  const add = useAddComment(takeId);
  const [kind, setKind] = useState<CommentTarget["kind"]>("take");
  const [body, setBody] = useState("");
  const [startSec, setStartSec] = useState("");
  const [endSec, setEndSec] = useState("");
  const [noteIndex, setNoteIndex] = useState("");
  const [errors, setErrors] = useState<FormErrors>({});
  const [saved, setSaved] = useState(false);
  const id = (s: string) => `${idPrefix}-${s}`;

  const submit = async () => {
    setSaved(false);
    let target: unknown = { kind: "take" };
    const local: FormErrors = {};
    if (kind === "range") {
      if (startSec.trim() === "") local.startSec = "Give the start in seconds.";
      if (endSec.trim() === "") local.endSec = "Give the end in seconds.";
      target = { kind: "range", startSec: Number(startSec), endSec: Number(endSec) };
    } else if (kind === "note") {
      const n = notes[Number(noteIndex)];
      if (noteIndex === "" || !n) local.noteIndex = "Choose a note.";
      else target = { kind: "note", noteIndex: Number(noteIndex), onsetSec: n.onsetSec, pitch: n.pitch };
    }
    const checked = validate(newCommentSchema, { body, target });
    const found: FormErrors = { ...local };
    if (!checked.ok) for (const [k, v] of Object.entries(checked.errors)) found[k.replace(/^target\./, "")] ??= v;
    if (Object.keys(found).length > 0 || !checked.ok) {
      setErrors(found);
      return;
    }
    setErrors({});
    try {
      await add.mutateAsync({ body: checked.data.body, target: checked.data.target });
      setBody("");
      setSaved(true);
    } catch (e) {
      setErrors(apiErrors(e));
    }
  };

  return (
    <form
      className="space-y-3"
      aria-label="New comment"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      <Field label="About" htmlFor={id("target")}>
        <Select value={kind} onChange={(e) => setKind(e.target.value as CommentTarget["kind"])}>
          <option value="take">The whole take</option>
          <option value="range">A time range</option>
          <option value="note" disabled={notes.length === 0}>One note</option>
        </Select>
      </Field>
      {kind === "range" ? (
        <div className="grid grid-cols-2 gap-3">
          <Field label="From (s)" htmlFor={id("start")} error={errors.startSec}>
            <Input inputMode="decimal" className="font-mono" value={startSec} onChange={(e) => setStartSec(e.target.value)} placeholder="12.5" />
          </Field>
          <Field label="To (s)" htmlFor={id("end")} error={errors.endSec}>
            <Input inputMode="decimal" className="font-mono" value={endSec} onChange={(e) => setEndSec(e.target.value)} placeholder="16" />
          </Field>
        </div>
      ) : null}
      {kind === "note" ? (
        <Field label="Note" htmlFor={id("note")} error={errors.noteIndex ?? errors.onsetSec ?? errors.pitch}>
          <Select value={noteIndex} onChange={(e) => setNoteIndex(e.target.value)} className="font-mono">
            <option value="">Choose a note…</option>
            {notes.map((n, i) => (
              <option key={i} value={i}>
                {formatClock(n.onsetSec)} · {midiToNoteName(n.pitch)} · voice {n.voice}
              </option>
            ))}
          </Select>
        </Field>
      ) : null}
      <Field label="Comment" htmlFor={id("body")} error={errors.body} hint="Up to 2000 characters. The studio’s listeners get an e-mail.">
        <Textarea value={body} onChange={(e) => setBody(e.target.value)} rows={3} maxLength={2100} />
      </Field>
      {errors.form ? <p role="alert" className="text-sm text-danger">{errors.form}</p> : null}
      <div className="flex items-center gap-3">
        <Button type="submit" loading={add.isPending}>Add comment</Button>
        {saved ? <span role="status" className="text-sm text-ink-muted">Comment added.</span> : null}
      </div>
    </form>
  );
}

/** A reply under a comment (anyone who can read the take). */
export function ReplyForm({ takeId, parentId, onDone }: { takeId: string; parentId: string; onDone: () => void }) {
  const add = useAddComment(takeId);
  const [body, setBody] = useState("");
  const [errors, setErrors] = useState<FormErrors>({});
  const fid = `reply-${parentId}`;
  return (
    <form
      className="space-y-2"
      aria-label="Reply"
      noValidate
      onSubmit={async (e) => {
        e.preventDefault();
        const checked = validate(newCommentSchema, { body, parentId });
        if (!checked.ok) return setErrors(checked.errors);
        setErrors({});
        try {
          await add.mutateAsync({ body: checked.data.body, parentId });
          setBody("");
          onDone();
        } catch (err) {
          setErrors(apiErrors(err));
        }
      }}
    >
      <Field label="Your reply" htmlFor={fid} error={errors.body}>
        <Textarea value={body} onChange={(e) => setBody(e.target.value)} rows={2} maxLength={2100} data-autofocus="" />
      </Field>
      {errors.form ? <p role="alert" className="text-sm text-danger">{errors.form}</p> : null}
      <div className="flex gap-2">
        <Button type="submit" size="sm" loading={add.isPending}>Send reply</Button>
        <Button size="sm" variant="ghost" onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}
