"use client";
import { useEffect, useState, type ReactNode } from "react";
import { Button, Cents, Mono } from "@/components/ui";
import { barBeatAt, type Meter } from "@/components/piano-roll";
import { VoiceSwatch } from "@/components/report/voices";
import { MAX_VELOCITY, MIN_VELOCITY, isSingle, summarise, type NoteList, type Selection } from "@/lib/editor";
import { midiToNoteName } from "@/lib/music/pitch";
import { compactControl } from "./EditorToolbar";

const sec = (x: number) => `${x.toFixed(3)} s`;

/**
 * The selected notes: pitch (name and MIDI number), onset, length, velocity, cents and voice.
 * One note shows its values; several show ranges, or "mixed". Editors change velocity here
 * (one undo step) and reset cents.
 */
export function Inspector({
  notes,
  selection,
  editable,
  meter,
  onVelocity,
  onResetCents,
}: {
  notes: NoteList;
  selection: Selection;
  editable: boolean;
  meter: Meter | null;
  onVelocity: (velocity: number) => void;
  onResetCents: () => void;
}) {
  const s = summarise(notes, selection);
  return (
    <aside aria-label="Selected notes" data-testid="inspector" className="rounded-lg border border-rule bg-paper p-4 text-sm">
      <h3 className="mb-3 font-semibold text-ink">{s ? (s.count === 1 ? "Selected note" : <><Mono>{s.count}</Mono> notes selected</>) : "Inspector"}</h3>
      {!s ? (
        <p className="text-ink-muted">
          {notes.length === 0 ? "No notes yet." : <>Select a note to see its pitch, onset, length, velocity and cents. <Mono>{notes.length}</Mono> notes in all.</>}
        </p>
      ) : (
        <dl className="grid grid-cols-[auto_1fr] items-baseline gap-x-3 gap-y-2">
          <Row label="Pitch">
            {isSingle(s.pitch) ? (
              <span data-testid="inspector-pitch">
                <span className="font-medium">{midiToNoteName(s.pitch.min)}</span> <Mono className="text-ink-muted">MIDI {s.pitch.min}</Mono>
              </span>
            ) : (
              <span data-testid="inspector-pitch">
                <span className="font-medium">{midiToNoteName(s.pitch.min)}–{midiToNoteName(s.pitch.max)}</span>{" "}
                <Mono className="text-ink-muted">MIDI {s.pitch.min}–{s.pitch.max}</Mono>
              </span>
            )}
          </Row>
          <Row label="Onset">
            <Mono data-testid="inspector-onset">{isSingle(s.onsetSec, 5e-4) ? sec(s.onsetSec.min) : `${s.onsetSec.min.toFixed(3)}–${sec(s.onsetSec.max)}`}</Mono>
            {meter && isSingle(s.onsetSec, 5e-4) ? <BarBeat meter={meter} at={s.onsetSec.min} /> : null}
          </Row>
          <Row label="Length">
            <Mono>{isSingle(s.lengthSec, 5e-4) ? sec(s.lengthSec.min) : `${s.lengthSec.min.toFixed(3)}–${sec(s.lengthSec.max)}`}</Mono>
          </Row>
          <Row label="Velocity">
            {editable ? (
              <VelocityInput key={[...selection].join(",")} min={s.velocity.min} max={s.velocity.max} onCommit={onVelocity} />
            ) : (
              <Mono>{isSingle(s.velocity) ? s.velocity.min : `mixed (${s.velocity.min}–${s.velocity.max})`}</Mono>
            )}
          </Row>
          <Row label="Cents">
            <span className="flex flex-wrap items-center gap-2">
              {isSingle(s.cents, 0.05) ? (
                <Cents value={s.cents.min} gauge />
              ) : (
                <span className="flex items-center gap-1">
                  <Cents value={s.cents.min} /> <span className="text-ink-muted">to</span> <Cents value={s.cents.max} />
                </span>
              )}
              {editable && (s.cents.min !== 0 || s.cents.max !== 0) ? (
                <Button size="sm" variant="ghost" onClick={onResetCents} className="h-6 px-2 text-xs">
                  Reset
                </Button>
              ) : null}
            </span>
          </Row>
          <Row label={s.voices.length === 1 ? "Voice" : "Voices"}>
            <span className="flex flex-wrap gap-2">
              {s.voices.map((v) => (
                <span key={v} className="inline-flex items-center gap-1">
                  <VoiceSwatch voice={v} /> <Mono>{v}</Mono>
                </span>
              ))}
            </span>
          </Row>
        </dl>
      )}
    </aside>
  );
}

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <>
      <dt className="text-ink-muted">{label}</dt>
      <dd className="min-w-0">{children}</dd>
    </>
  );
}

function BarBeat({ meter, at }: { meter: Meter; at: number }) {
  const { bar, beat } = barBeatAt(meter, at);
  return <span className="ml-2 text-ink-muted">bar <Mono>{bar}</Mono>, beat <Mono>{Number(beat.toFixed(2))}</Mono></span>;
}

/** Velocity 1–127 for the selection: applied on Enter or when the field is left, as one edit. */
function VelocityInput({ min, max, onCommit }: { min: number; max: number; onCommit: (v: number) => void }) {
  const single = min === max;
  const [text, setText] = useState(single ? String(min) : "");
  const [error, setError] = useState<string | null>(null);
  useEffect(() => setText(single ? String(min) : ""), [min, single]);
  const commit = () => {
    if (text.trim() === "") return setError(null);
    const v = Number(text);
    if (!Number.isInteger(v) || v < MIN_VELOCITY || v > MAX_VELOCITY) return setError(`A whole number from ${MIN_VELOCITY} to ${MAX_VELOCITY}.`);
    setError(null);
    if (!(single && v === min)) onCommit(v);
  };
  return (
    <span className="block">
      <input
        aria-label="Velocity of the selected notes"
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? "velocity-error" : undefined}
        inputMode="numeric"
        className={compactControl(`w-24 font-mono ${error ? "border-danger" : ""}`)}
        placeholder={single ? undefined : `mixed ${min}–${max}`}
        value={text}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === "Enter") commit();
          if (e.key === "Escape") setText(single ? String(min) : "");
        }}
      />
      {error ? (
        <span id="velocity-error" role="alert" className="mt-1 block text-xs text-danger">
          {error}
        </span>
      ) : null}
    </span>
  );
}
