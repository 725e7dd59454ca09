"use client";
import { Alert, Button, Mono, cx } from "@/components/ui";
import { formatClock } from "@/components/report/format";
import { LISTEN_MODES, type ListenMode } from "./sounding";
import { SYNTH_VOICES, isSynthVoice } from "./synth-voices";
import { useTimeViewState, type TimeView } from "./time-view";
import type { Playback } from "./use-playback";
import { LevelControl } from "./LevelControl";

export const MODE_LABEL: Record<ListenMode, string> = { original: "Original", notes: "Notes", both: "Both" };
export const MODE_HINT: Record<ListenMode, string> = {
  original: "the recording only",
  notes: "the notes, resynthesised at the pitch they were played",
  both: "the recording with the notes over it",
};

/** Where playback is and how long the take is; re-renders on its own every frame. */
function Position({ view, lengthSec }: { view: TimeView; lengthSec: number }) {
  const { playheadSec } = useTimeViewState(view);
  return (
    <p className="text-sm tabular-nums" data-testid="transport-clock" aria-live="off">
      <Mono>{formatClock(playheadSec)}</Mono> <span className="text-ink-muted">/</span> <Mono>{formatClock(lengthSec)}</Mono>
    </p>
  );
}

function LoopControls({ view }: { view: TimeView }) {
  const { loop, playheadSec, durationSec } = useTimeViewState(view);
  const setIn = () => {
    const end = loop && loop.endSec > playheadSec ? loop.endSec : Math.min(durationSec, playheadSec + 4);
    view.setLoop({ startSec: playheadSec, endSec: end });
  };
  const setOut = () => {
    const start = loop && loop.startSec < playheadSec ? loop.startSec : Math.max(0, playheadSec - 4);
    view.setLoop({ startSec: start, endSec: playheadSec });
  };
  return (
    <div className="flex items-center gap-1.5 text-sm" role="group" aria-label="Loop">
      <span className="text-ink-muted">Loop</span>
      <Button size="sm" variant="secondary" onClick={setIn} title="Start the loop at the playhead" data-testid="loop-in">
        In
      </Button>
      <Button size="sm" variant="secondary" onClick={setOut} title="End the loop at the playhead" data-testid="loop-out">
        Out
      </Button>
      {loop ? (
        <>
          <Mono className="text-xs" data-testid="loop-range">
            {formatClock(loop.startSec)}–{formatClock(loop.endSec)}
          </Mono>
          <Button size="sm" variant="secondary" onClick={() => view.setLoop(null)} data-testid="loop-clear">
            Clear loop
          </Button>
        </>
      ) : (
        <span className="text-xs text-ink-muted">or drag along the ruler</span>
      )}
    </div>
  );
}

/**
 * The transport: play/pause (also the space bar), where playback is, the listen mode with the
 * balance between recording and notes, the synth voice, the loop and the master level.
 */
export function TransportBar({ player, view, lengthSec, hasNotes, referenceHz }: { player: Playback; view: TimeView; lengthSec: number; hasNotes: boolean; referenceHz: number }) {
  const mode = hasNotes ? player.mode : "original";
  return (
    <div className="space-y-2 border-b border-rule px-3 py-2.5" data-testid="transport">
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <Button
          onClick={() => player.toggle()}
          loading={player.starting}
          aria-label={player.playing ? "Pause" : "Play"}
          aria-keyshortcuts="Space"
          className="min-w-24"
          data-testid="transport-play"
        >
          {player.playing ? "Pause" : "Play"}
        </Button>
        <Position view={view} lengthSec={lengthSec} />
        <div role="radiogroup" aria-label="Listen to" className="flex gap-1">
          {LISTEN_MODES.map((m) => {
            const disabled = !hasNotes && m !== "original";
            return (
              <button
                key={m}
                type="button"
                role="radio"
                aria-checked={mode === m}
                disabled={disabled}
                title={disabled ? "No notes yet: the recording only" : MODE_HINT[m]}
                onClick={() => player.engine.setMode(m)}
                className={cx(
                  "h-8 rounded-md border px-3 text-sm disabled:cursor-not-allowed disabled:opacity-50",
                  mode === m ? "border-copper bg-copper/10 font-medium" : "border-rule bg-surface hover:border-ink/35",
                )}
              >
                {MODE_LABEL[m]}
              </button>
            );
          })}
        </div>
        <label className={cx("flex items-center gap-2 text-sm", mode !== "both" && "opacity-50")}>
          <span className="text-ink-muted">Recording</span>
          <input
            type="range"
            min={-1}
            max={1}
            step={0.05}
            value={player.balance}
            disabled={mode !== "both"}
            onChange={(e) => player.engine.setBalance(Number(e.target.value))}
            onDoubleClick={() => player.engine.setBalance(0)}
            aria-label="Balance between the recording and the notes"
            aria-valuetext={player.balance === 0 ? "even" : player.balance < 0 ? `toward the recording, ${Math.round(-player.balance * 100)} %` : `toward the notes, ${Math.round(player.balance * 100)} %`}
            className="w-24 accent-[var(--tn-copper)]"
            data-testid="balance"
          />
          <span className="text-ink-muted">Notes</span>
        </label>
        <label className="flex items-center gap-2 text-sm">
          <span className="text-ink-muted">Voice</span>
          <select
            value={player.voice}
            onChange={(e) => isSynthVoice(e.target.value) && player.engine.setVoice(e.target.value)}
            disabled={!hasNotes}
            className="h-8 rounded-md border border-rule bg-surface px-2 text-sm"
            aria-label="Synth voice for the notes"
          >
            {SYNTH_VOICES.map((v) => (
              <option key={v.id} value={v.id} title={v.hint}>
                {v.label}
              </option>
            ))}
          </select>
        </label>
        <LevelControl level={player.level} onChange={(l) => player.engine.setLevel(l)} />
      </div>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <LoopControls view={view} />
        <p className="ml-auto text-xs text-ink-muted">
          {hasNotes ? <>Listening to {MODE_HINT[mode]}; the notes sound at their measured pitch (take’s A4 ≈ <Mono>{referenceHz.toFixed(1)} Hz</Mono>).</> : "No notes yet: you hear the recording only."}{" "}
          Space plays and pauses.
        </p>
      </div>
      {player.caution ? (
        <div role="note" data-testid="hearing-caution" className="flex items-start gap-2 rounded-md border border-copper/40 bg-copper/5 px-3 py-2 text-sm">
          <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 text-copper" fill="currentColor">
            <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 7h1.5v4.5h-1.5V7Zm0-2.75h1.5v1.5h-1.5v-1.5Z" />
          </svg>
          <span className="flex-1">
            Mind your ears: playback starts at a low level (<Mono>25 %</Mono>). Turn it up slowly, especially with headphones; loud sound for long can damage hearing.
          </span>
          <Button size="sm" variant="secondary" onClick={() => player.engine.dismissCaution()}>
            Got it
          </Button>
        </div>
      ) : null}
      {player.error ? <Alert tone="error">{player.error}</Alert> : null}
      {player.audioError ? (
        <Alert tone="error" title="The recording could not be loaded" action={<Button size="sm" variant="secondary" onClick={() => player.engine.reload()}>Try again</Button>}>
          {hasNotes ? "The notes can still be played." : "Check the connection and try again."}
        </Alert>
      ) : null}
    </div>
  );
}
