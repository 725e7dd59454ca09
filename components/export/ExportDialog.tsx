"use client";
import Link from "next/link";
import { useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { Alert, Button, Dialog, Field, Input, Mono, Select } from "@/components/ui";
import { creditKeys, useCredits } from "@/components/billing/use-credits";
import { exportQuerySchema } from "@/lib/schemas/export";
import { validate, type FormErrors } from "@/lib/client/forms";
import { useRevisions } from "./use-revisions";

const FORMATS = [
  { id: "midi", label: "Standard MIDI File (.mid)", cost: 1 },
  { id: "musicxml", label: "MusicXML 4.0 (.musicxml)", cost: 1 },
  { id: "csv", label: "CSV note list (.csv)", cost: 0 },
] as const;

/** Export the take's notes; MIDI and MusicXML use one export credit, CSV is free. */
export function ExportDialog({ takeId, open, onClose, canBuy }: { takeId: string; open: boolean; onClose: () => void; canBuy: boolean }) {
  const queryClient = useQueryClient();
  const credits = useCredits(false);
  const revisions = useRevisions(takeId, open);
  const [format, setFormat] = useState<(typeof FORMATS)[number]["id"]>("midi");
  const [errors, setErrors] = useState<FormErrors>({});
  const [failure, setFailure] = useState<{ noCredits: boolean; message: string } | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const cost = FORMATS.find((f) => f.id === format)!.cost;

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setFailure(null);
    setDone(null);
    const data = new FormData(event.currentTarget);
    const values: Record<string, string> = { format };
    for (const key of ["revision", "quantize", "tempo", "timeSignature"]) {
      const v = String(data.get(key) ?? "").trim();
      if (v) values[key] = v;
    }
    if (data.get("pitchBend") === "on") values.pitchBend = "1";
    const result = validate(exportQuerySchema, values);
    if (!result.ok) return setErrors(result.errors);
    setErrors({});
    setBusy(true);
    try {
      const res = await fetch(`/api/v1/takes/${takeId}/export?${new URLSearchParams(values)}`, { credentials: "same-origin" });
      if (!res.ok) {
        const body = await res.json().catch(() => null);
        setFailure({ noCredits: res.status === 402, message: body?.error?.message ?? `The export failed (${res.status}).` });
        return;
      }
      const name = /filename="([^"]+)"/.exec(res.headers.get("content-disposition") ?? "")?.[1] ?? `take.${format}`;
      const url = URL.createObjectURL(await res.blob());
      const a = document.createElement("a");
      a.href = url;
      a.download = name;
      document.body.appendChild(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      setDone(name);
      void queryClient.invalidateQueries({ queryKey: creditKeys.all });
    } catch {
      setFailure({ noCredits: false, message: "Tapernote could not be reached. Try again." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <Dialog open={open} onClose={onClose} title="Export notes" size="md">
      <form method="post" onSubmit={submit} noValidate className="space-y-4" aria-label="Export notes">
        <fieldset className="space-y-2">
          <legend className="mb-1 text-sm font-medium">Format</legend>
          {FORMATS.map((f) => (
            <label key={f.id} className="flex items-center gap-2 text-sm">
              <input type="radio" name="format" value={f.id} checked={format === f.id} onChange={() => setFormat(f.id)} />
              {f.label} <span className="text-ink-muted">{f.cost ? "— 1 credit" : "— free"}</span>
            </label>
          ))}
        </fieldset>
        <Field label="Notes to export" htmlFor="export-revision" error={errors.revision}>
          <Select id="export-revision" name="revision" defaultValue="">
            <option value="">The latest (newest revision, else the draft)</option>
            {(revisions.data ?? []).map((r) => (
              <option key={r.number} value={r.number}>Revision {r.number} — {r.noteCount} notes</option>
            ))}
          </Select>
        </Field>
        {format !== "csv" ? (
          <div className="grid gap-3 sm:grid-cols-3">
            <Field label="Quantise to" htmlFor="export-quantize" error={errors.quantize}>
              <Select id="export-quantize" name="quantize" defaultValue={format === "musicxml" ? "1/16" : ""}>
                {format === "midi" ? <option value="">Off (as played)</option> : null}
                {["1/4", "1/8", "1/12", "1/16", "1/32"].map((q) => <option key={q} value={q}>{q}</option>)}
              </Select>
            </Field>
            <Field label="Tempo (bpm)" htmlFor="export-tempo" error={errors.tempo} hint="Blank: estimated.">
              <Input id="export-tempo" name="tempo" inputMode="decimal" placeholder="estimate" invalid={!!errors.tempo} />
            </Field>
            <Field label="Time signature" htmlFor="export-ts" error={errors.timeSignature}>
              <Input id="export-ts" name="timeSignature" placeholder="4/4" invalid={!!errors.timeSignature} />
            </Field>
          </div>
        ) : null}
        {format === "midi" ? (
          <label className="flex items-start gap-2 text-sm">
            <input type="checkbox" name="pitchBend" className="mt-1" />
            <span>
              Carry each note&apos;s cents as pitch bend. Each voice goes on its own channel and the bend range is set to
              ±2 semitones with RPN 0 at the start of every track — that is what makes a bend mean the same number of
              cents in every player.
            </span>
          </label>
        ) : null}
        <p className="text-sm text-ink-muted">
          {cost ? "This export uses 1 export credit." : "CSV exports are free."}{" "}
          {credits.data ? <>Credits available: <Mono>{credits.data.balance}</Mono>.</> : null}
        </p>
        {failure ? (
          <Alert tone="error" title={failure.noCredits ? "No export credits left" : "The export failed"}>
            {failure.message}{" "}
            {failure.noCredits ? (canBuy ? <Link href="/billing" className="underline">Buy an export pack</Link> : "Ask a studio owner to buy an export pack.") : null}
          </Alert>
        ) : null}
        {done ? <Alert tone="success">Downloaded {done}.</Alert> : null}
        <div className="flex justify-end gap-2">
          <Button type="button" variant="secondary" onClick={onClose}>Close</Button>
          <Button type="submit" loading={busy}>Export</Button>
        </div>
      </form>
    </Dialog>
  );
}
