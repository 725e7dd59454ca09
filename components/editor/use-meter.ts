"use client";
import { useCallback, useEffect, useState } from "react";
import { validMeter, type Meter } from "@/components/piano-roll";

const storageKey = (takeId: string) => `tapernote.meter.${takeId}`;

/**
 * The tempo and beats per bar of a take's ruler and snap grid, as typed (kept in this browser
 * per take: the API has no tempo of its own). `meter` is null while the tempo is blank or invalid.
 */
export function useMeter(takeId: string) {
  const [tempoText, setTempoText] = useState("");
  const [beatsPerBar, setBeatsPerBar] = useState(4);
  useEffect(() => {
    try {
      const saved = JSON.parse(window.localStorage.getItem(storageKey(takeId)) ?? "null") as Meter | null;
      if (saved && validMeter(saved)) {
        setTempoText(String(saved.tempoBpm));
        setBeatsPerBar(saved.beatsPerBar);
      }
    } catch {
      // nothing saved, or storage is off
    }
  }, [takeId]);
  const tempoBpm = tempoText.trim() === "" ? Number.NaN : Number(tempoText.replace(",", "."));
  const candidate = { tempoBpm, beatsPerBar };
  const meter = validMeter(candidate) ? candidate : null;
  const error = tempoText.trim() !== "" && !meter ? "A tempo from 20 to 400 bpm." : null;
  const persist = useCallback(
    (m: Meter | null) => {
      try {
        if (m) window.localStorage.setItem(storageKey(takeId), JSON.stringify(m));
        else window.localStorage.removeItem(storageKey(takeId));
      } catch {
        // storage is off: the tempo lasts for this visit
      }
    },
    [takeId],
  );
  useEffect(() => {
    if (tempoText.trim() === "") persist(null);
    else if (meter) persist(meter);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [tempoText, beatsPerBar, persist]);
  return { tempoText, setTempoText, beatsPerBar, setBeatsPerBar, meter, error };
}
