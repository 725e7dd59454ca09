"use client";
import { Button } from "@/components/ui";
import type { TimeView } from "@/components/timeline/time-view";
import { SnapSelect, compactControl } from "./EditorToolbar";
import type { useMeter } from "./use-meter";

/** Zoom, tempo (and, for editors, the snap grid) and what the roll overlays. */
export function ViewControls({
  timeView,
  meter,
  snap,
  assignment,
}: {
  timeView: TimeView;
  meter: ReturnType<typeof useMeter>;
  /** Editors only: the snap grid, beside the tempo it needs. */
  snap: { value: number; onChange: (subdivision: number) => void } | null;
  assignment: { available: boolean; shown: boolean; onToggle: (shown: boolean) => void; loading: boolean };
}) {
  const zoom = (factor: number) => {
    const s = timeView.get();
    const widthSec = s.areaWidthPx > 0 ? s.areaWidthPx / s.window.pxPerSec : 10;
    timeView.zoomAt(s.window.startSec + widthSec / 2, factor);
  };
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
      <div className="flex items-center gap-1" role="group" aria-label="Time zoom">
        <Button size="sm" variant="ghost" onClick={() => zoom(1 / 1.5)} title="Zoom out in time (Ctrl/⌘ + wheel)">
          Zoom out
        </Button>
        <Button size="sm" variant="ghost" onClick={() => zoom(1.5)} title="Zoom in in time (Ctrl/⌘ + wheel)">
          Zoom in
        </Button>
        <Button size="sm" variant="ghost" onClick={() => timeView.fit()} title="Show the whole take">
          Whole take
        </Button>
      </div>
      <label className="flex items-center gap-2">
        <span className="text-ink-muted">Tempo</span>
        <input
          aria-label="Tempo (bpm)"
          aria-invalid={meter.error ? true : undefined}
          aria-describedby={meter.error ? "tempo-error" : undefined}
          inputMode="decimal"
          placeholder="none"
          className={compactControl(`w-16 font-mono ${meter.error ? "border-danger" : ""}`)}
          value={meter.tempoText}
          onChange={(e) => meter.setTempoText(e.target.value)}
        />
        <span className="text-ink-muted">bpm</span>
      </label>
      <label className="flex items-center gap-2">
        <span className="whitespace-nowrap text-ink-muted">Beats per bar</span>
        <select aria-label="Beats per bar" className={compactControl("w-16")} value={meter.beatsPerBar} onChange={(e) => meter.setBeatsPerBar(Number(e.target.value))}>
          {[2, 3, 4, 5, 6, 7, 9, 12].map((b) => (
            <option key={b} value={b}>
              {b}
            </option>
          ))}
        </select>
      </label>
      {snap ? <SnapSelect value={snap.value} onChange={snap.onChange} hasTempo={!!meter.meter} /> : null}
      {meter.error ? (
        <span id="tempo-error" role="alert" className="text-danger">
          {meter.error}
        </span>
      ) : null}
      {assignment.available ? (
        <label className="flex items-center gap-2">
          <input type="checkbox" checked={assignment.shown} onChange={(e) => assignment.onToggle(e.target.checked)} />
          Show the assignment <span className="text-ink-muted">(dashed outlines)</span>
        </label>
      ) : assignment.loading ? null : (
        <span className="text-ink-muted" title="Attach an assignment in the teaching panel below to overlay its notes">
          No assignment attached
        </span>
      )}
    </div>
  );
}
