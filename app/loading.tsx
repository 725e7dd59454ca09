export default function Loading() {
  return (
    <div className="flex min-h-[50dvh] w-full items-center justify-center px-6 py-16" role="status" aria-live="polite">
      <div className="flex flex-col items-center gap-4">
        {/* a playhead crossing a short staff */}
        <svg aria-hidden="true" viewBox="0 0 96 40" className="h-10 w-24" fill="none">
          {[4, 12, 20, 28, 36].map((y) => (
            <line key={y} x1="2" x2="94" y1={y} y2={y} className="stroke-rule" strokeWidth="1.25" />
          ))}
          <rect x="14" y="21" width="22" height="6" rx="2.5" className="fill-voice-teal/80" />
          <rect x="42" y="13" width="18" height="6" rx="2.5" className="fill-voice-plum/80" />
          <rect x="64" y="25" width="20" height="6" rx="2.5" className="fill-voice-ochre/80" />
          <line
            x1="8"
            x2="8"
            y1="0"
            y2="40"
            className="stroke-copper motion-safe:animate-[tn-playhead_1.6s_ease-in-out_infinite]"
            strokeWidth="2"
          />
        </svg>
        <p className="text-sm text-ink-muted">Loading…</p>
      </div>
    </div>
  );
}
