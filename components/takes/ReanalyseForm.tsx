"use client";
import { useState, type FormEvent } from "react";
import type { z } from "zod";
import { Alert, Button, Field, Input, Select } from "@/components/ui";
import { ApiClientError, firstErrors } from "@/lib/client/api";
import { formValues } from "@/lib/client/forms";
import { settingsSchema, type Settings } from "@/lib/engine/settings";
import { TAPER_NAMES } from "@/lib/engine/tapers";
import { taperLabel } from "./settings-summary";
import { useReanalyse } from "./use-reanalyse";

const COMMON_REFERENCES = ["440", "442", "415"] as const;

/** Settings to start from: the given ones where they are valid, else the engine's defaults. */
export function startingSettings(from: Record<string, unknown> | undefined): Settings {
  const parsed = settingsSchema.safeParse(from ?? {});
  return parsed.success ? parsed.data : settingsSchema.parse({});
}

function toNumber(value: string | undefined): number {
  const v = (value ?? "").trim().replace(",", ".");
  return v === "" ? Number.NaN : Number(v);
}

/** The engine's zod issues in words, keyed by the setting's path ("frameLengthsMs.low"). */
function issueMessages(issues: z.core.$ZodIssue[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) {
    const key = issue.path.join(".") || "form";
    if (out[key]) continue;
    const i = issue as z.core.$ZodIssue & { minimum?: number; maximum?: number; expected?: string };
    if (key === "referenceHz") out[key] = "Enter a reference pitch between 380 and 500 Hz.";
    else if (i.code === "too_small") out[key] = `Enter ${i.minimum} or more.`;
    else if (i.code === "too_big") out[key] = `Enter ${i.maximum} or less.`;
    else if (i.code === "invalid_type" && i.expected === "int") out[key] = "Enter a whole number.";
    else if (i.code === "invalid_type") out[key] = "Enter a number.";
    else out[key] = issue.message;
  }
  return out;
}

/** Start a new analysis of the take with other settings; validated with the engine's own schema. */
export function ReanalyseForm({ takeId, initial, onStarted }: { takeId: string; initial: Settings; onStarted?: () => void }) {
  const reanalyse = useReanalyse(takeId);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [started, setStarted] = useState(false);
  const [taper, setTaper] = useState<string>(initial.taper);
  const initialReference =
    initial.referenceHz === "estimate" ? "estimate" : (COMMON_REFERENCES as readonly string[]).includes(String(initial.referenceHz)) ? String(initial.referenceHz) : "other";
  const [reference, setReference] = useState<string>(initialReference);

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setFormError(null);
    setStarted(false);
    const v = formValues(event.currentTarget);
    const input = {
      taper: v.taper,
      ...(v.taper === "kaiser" ? { kaiserBeta: toNumber(v.kaiserBeta) } : {}),
      ...(v.taper === "gaussian" ? { gaussianAlpha: toNumber(v.gaussianAlpha) } : {}),
      frameLengthsMs: { low: toNumber(v.frameLow), mid: toNumber(v.frameMid), high: toNumber(v.frameHigh) },
      hopMs: toNumber(v.hopMs),
      referenceHz: v.reference === "estimate" ? "estimate" : v.reference === "other" ? toNumber(v.referenceOther) : Number(v.reference),
      voiceLimit: toNumber(v.voiceLimit),
      shortestNoteMs: toNumber(v.shortestNoteMs),
      sensitivityDb: toNumber(v.sensitivityDb),
      pitchRange: initial.pitchRange,
    };
    const parsed = settingsSchema.safeParse(input);
    if (!parsed.success) return setErrors(issueMessages(parsed.error.issues));
    setErrors({});
    try {
      await reanalyse.mutateAsync(parsed.data);
      setStarted(true);
      onStarted?.();
    } catch (e) {
      if (e instanceof ApiClientError && e.fields) {
        const fields = firstErrors(e.fields);
        setErrors(Object.fromEntries(Object.entries(fields).map(([k, m]) => [k.replace(/^settings\./, ""), m])));
        setFormError(e.message);
      } else setFormError(e instanceof Error ? e.message : "The analysis could not be started.");
    }
  }

  const err = (key: string) => errors[key];
  return (
    <form method="post" onSubmit={submit} noValidate aria-label="Re-analyse with other settings" className="space-y-5">
      {formError ? <Alert tone="error">{formError}</Alert> : null}
      {started ? <Alert tone="success">A new analysis is queued. The earlier ones are kept.</Alert> : null}

      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <Field label="Taper" htmlFor="s-taper" error={err("taper")} hint="The window applied to each frame.">
          <Select name="taper" value={taper} onChange={(e) => setTaper(e.target.value)}>
            {TAPER_NAMES.map((t) => (
              <option key={t} value={t}>{taperLabel(t)}</option>
            ))}
          </Select>
        </Field>
        {taper === "kaiser" ? (
          <Field label="Kaiser β" htmlFor="s-kaiser" error={err("kaiserBeta")} hint="0 to 40; larger is wider and quieter at the sides.">
            <Input name="kaiserBeta" inputMode="decimal" defaultValue={initial.kaiserBeta} className="font-mono" />
          </Field>
        ) : null}
        {taper === "gaussian" ? (
          <Field label="Gaussian α" htmlFor="s-gaussian" error={err("gaussianAlpha")} hint="0.5 to 10; σ = N / (2α).">
            <Input name="gaussianAlpha" inputMode="decimal" defaultValue={initial.gaussianAlpha} className="font-mono" />
          </Field>
        ) : null}
      </div>

      <fieldset className="space-y-2">
        <legend className="text-sm font-medium">Frame length per register (ms)</legend>
        <p className="text-sm text-ink-muted">Low notes need long frames to tell neighbouring semitones apart; fast high passages need short ones.</p>
        <div className="grid gap-4 sm:grid-cols-3">
          <Field label="Low" htmlFor="s-frame-low" error={err("frameLengthsMs.low")} hint="64 to 1024">
            <Input name="frameLow" inputMode="decimal" defaultValue={initial.frameLengthsMs.low} className="font-mono" />
          </Field>
          <Field label="Middle" htmlFor="s-frame-mid" error={err("frameLengthsMs.mid")} hint="32 to 512">
            <Input name="frameMid" inputMode="decimal" defaultValue={initial.frameLengthsMs.mid} className="font-mono" />
          </Field>
          <Field label="High" htmlFor="s-frame-high" error={err("frameLengthsMs.high")} hint="16 to 256">
            <Input name="frameHigh" inputMode="decimal" defaultValue={initial.frameLengthsMs.high} className="font-mono" />
          </Field>
        </div>
      </fieldset>

      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <Field label="Hop (ms)" htmlFor="s-hop" error={err("hopMs")} hint="2 to 50, the same in every register.">
          <Input name="hopMs" inputMode="decimal" defaultValue={initial.hopMs} className="font-mono" />
        </Field>
        <Field label="Reference pitch (A4)" htmlFor="s-reference" error={reference === "other" ? undefined : err("referenceHz")} hint="Estimate it from the take, or set it.">
          <Select name="reference" value={reference} onChange={(e) => setReference(e.target.value)}>
            <option value="440">440 Hz</option>
            <option value="442">442 Hz</option>
            <option value="415">415 Hz (Baroque)</option>
            <option value="other">Other…</option>
            <option value="estimate">Estimate from the take</option>
          </Select>
        </Field>
        {reference === "other" ? (
          <Field label="Other reference (Hz)" htmlFor="s-reference-other" error={err("referenceHz")} hint="380 to 500">
            <Input
              name="referenceOther"
              inputMode="decimal"
              defaultValue={typeof initial.referenceHz === "number" ? initial.referenceHz : 440}
              className="font-mono"
            />
          </Field>
        ) : null}
        <Field label="Voice limit" htmlFor="s-voices" error={err("voiceLimit")} hint="Most notes sounding at once, 1 to 16.">
          <Input name="voiceLimit" inputMode="numeric" defaultValue={initial.voiceLimit} className="font-mono" />
        </Field>
        <Field label="Shortest note (ms)" htmlFor="s-shortest" error={err("shortestNoteMs")} hint="10 to 2000; shorter ones are dropped.">
          <Input name="shortestNoteMs" inputMode="decimal" defaultValue={initial.shortestNoteMs} className="font-mono" />
        </Field>
        <Field label="Sensitivity (dB)" htmlFor="s-sensitivity" error={err("sensitivityDb")} hint="6 to 80 dB below the loudest pitch.">
          <Input name="sensitivityDb" inputMode="decimal" defaultValue={initial.sensitivityDb} className="font-mono" />
        </Field>
      </div>

      <div className="flex justify-end">
        <Button type="submit" loading={reanalyse.isPending}>Re-analyse</Button>
      </div>
    </form>
  );
}
