"use client";
import { useEffect, useRef } from "react";

/** The level playback starts at: quiet, so a loud take does not startle or harm anyone's ears. */
export const INITIAL_VOLUME = 0.25;

/** The original recording, with the hearing caution. */
export function TakePlayer({ takeId, takeName }: { takeId: string; takeName: string }) {
  const ref = useRef<HTMLAudioElement>(null);
  useEffect(() => {
    if (ref.current) ref.current.volume = INITIAL_VOLUME;
  }, [takeId]);
  return (
    <div className="space-y-2">
      <audio
        ref={ref}
        controls
        preload="metadata"
        src={`/api/v1/takes/${takeId}/audio`}
        aria-label={`Original recording of ${takeName}`}
        className="w-full"
      >
        Your browser cannot play this recording here.
      </audio>
      <p className="flex items-start gap-1.5 text-xs text-ink-muted">
        <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-px size-3.5 shrink-0" fill="currentColor">
          <path d="M8 1.5a6.5 6.5 0 1 0 0 13 6.5 6.5 0 0 0 0-13ZM7.25 7h1.5v4.5h-1.5V7Zm0-2.75h1.5v1.5h-1.5v-1.5Z" />
        </svg>
        <span>Playback starts at a low level (25 %). Turn it up slowly, especially with headphones.</span>
      </p>
    </div>
  );
}
