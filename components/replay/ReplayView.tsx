"use client";
import type { ReactNode } from "react";
import { Alert, Button, Card, Cents, Mono, PageHeader, cx } from "@/components/ui";
import { midiToNoteName } from "@/lib/music/pitch";
import { formatClock } from "@/components/report/format";
import { SummaryStats } from "@/components/report/SummaryStats";
import type { TuningReportDto } from "@/components/report/types";
import { NoteStrip } from "./NoteStrip";
import { LISTEN_MODES, type ListenMode } from "./sounding";
import { useReplayPlayer, type ReplayNote } from "./use-replay-player";
import { LevelControl } from "@/components/timeline/LevelControl";

const MODE_LABEL: Record<ListenMode, string> = { original: "Original", notes: "Notes", both: "Both" };
const MODE_HINT: Record<ListenMode, string> = {
  original: "the recording only",
  notes: "the notes, resynthesised at the pitch they were played",
  both: "the recording with the notes over it",
};

/**
 * The read-only replay of a take for students: the recording, the notes resynthesised at the
 * pitch they sounded, or both, with a time-aligned note strip, the tuning summary and the
 * comments (passed in, as signed-in members and share-link visitors see them differently).
 */
export function ReplayView({
  title,
  description,
  actions,
  audioSrc,
  durationSec,
  notes,
  report,
  renderComments,
}: {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  audioSrc: string;
  durationSec: number;
  notes: ReplayNote[];
  report: TuningReportDto | null;
  renderComments: (seek: (sec: number) => void) => ReactNode;
}) {
  const player = useReplayPlayer(notes, durationSec);
  const length = player.durationSec ?? durationSec;
  return (
    <div className="space-y-6">
      <PageHeader title={title} description={description} actions={actions} />
      <Card title="Listen">
        <div className="space-y-4">
          {/* the recording is the clock; it has no controls of its own */}
          <audio ref={player.audioRef} src={audioSrc} preload="auto" className="hidden" aria-hidden="true" />
          <div className="flex flex-wrap items-center gap-4">
            <Button
              onClick={() => (player.playing ? player.pause() : void player.play())}
              loading={player.starting}
              aria-label={player.playing ? "Pause" : "Play"}
              className="min-w-24"
              data-testid="replay-play"
            >
              {player.playing ? "Pause" : "Play"}
            </Button>
            <div role="radiogroup" aria-label="Listen to" className="flex gap-1">
              {LISTEN_MODES.map((m) => (
                <button
                  key={m}
                  type="button"
                  role="radio"
                  aria-checked={player.mode === m}
                  title={MODE_HINT[m]}
                  onClick={() => player.setMode(m)}
                  className={cx("h-9 rounded-md border px-3 text-sm", player.mode === m ? "border-copper bg-copper/10 font-medium" : "border-rule bg-surface hover:border-ink/35")}
                >
                  {MODE_LABEL[m]}
                </button>
              ))}
            </div>
            <p className="text-sm" data-testid="replay-clock">
              <Mono>{formatClock(player.positionSec)}</Mono> <span className="text-ink-muted">/</span> <Mono>{formatClock(length)}</Mono>
            </p>
            <LevelControl level={player.level} onChange={player.setLevel} />
          </div>
          <p className="text-xs text-ink-muted">Listening to {MODE_HINT[player.mode]}.</p>
          <input
            type="range"
            min={0}
            max={Math.max(0.01, length)}
            step={0.01}
            value={Math.min(player.positionSec, length)}
            onChange={(e) => player.seek(Number(e.target.value))}
            aria-label="Position"
            aria-valuetext={formatClock(player.positionSec)}
            className="w-full accent-[var(--tn-copper)]"
          />
          <NoteStrip notes={notes} durationSec={length} positionSec={player.positionSec} onSeek={player.seek} />
          <p className="flex items-start gap-1.5 text-xs text-ink-muted">
            <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-px size-3.5 shrink-0" fill="currentColor">
              <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 7h1.5v4.5h-1.5V7Zm0-2.75h1.5v1.5h-1.5v-1.5Z" />
            </svg>
            <span>Playback starts at a low level (25 %). Turn it up slowly, especially with headphones.</span>
          </p>
          {player.error ? <Alert tone="error">{player.error}</Alert> : null}
        </div>
      </Card>

      {report ? (
        <Card title="How in tune" description={<>Against equal temperament at A4 = <Mono>{report.referenceHz.toFixed(1)} Hz</Mono>.</>}>
          <div className="space-y-4">
            <SummaryStats summary={report.summary} compact />
            {report.summary.worst.length > 0 ? (
              <div>
                <h3 className="mb-2 text-sm font-semibold">Furthest from the pitch</h3>
                <ul className="flex flex-wrap gap-2">
                  {report.summary.worst.slice(0, 6).map((w) => (
                    <li key={w.noteIndex}>
                      <button type="button" onClick={() => player.seek(Math.max(0, w.onsetSec - 0.5))} className="inline-flex items-center gap-2 rounded-full border border-rule bg-paper px-3 py-1 text-sm hover:border-copper" title="Play from just before this note">
                        <span className="font-medium">{midiToNoteName(w.pitch)}</span>
                        <Mono className="text-ink-muted">{formatClock(w.onsetSec)}</Mono>
                        <Cents value={w.centsEqual} />
                      </button>
                    </li>
                  ))}
                </ul>
              </div>
            ) : null}
          </div>
        </Card>
      ) : null}

      <Card title="Comments">{renderComments(player.seek)}</Card>
    </div>
  );
}
