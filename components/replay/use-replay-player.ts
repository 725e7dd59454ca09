"use client";
import { useCallback, useEffect, useRef, useState } from "react";
import { INITIAL_LEVEL, soundingHz, type ListenMode } from "./sounding";

export type ReplayNote = { onsetSec: number; offsetSec: number; pitch: number; cents: number; velocity: number; voice: number };

type ToneModule = typeof import("tone");
type Voices = { synth: InstanceType<ToneModule["PolySynth"]>; gain: InstanceType<ToneModule["Gain"]> };

/** How far ahead of the recording's clock notes are handed to the synthesiser, and how often. */
const LOOKAHEAD_SEC = 0.12;
const TICK_MS = 25;

/**
 * The replay's clock and sound. The <audio> element is the clock in every mode (muted in
 * `notes`), and a small scheduler hands each note to a Tone.js PolySynth just before the
 * recording reaches it, at the frequency it sounded at. Each play gets fresh voices, faded out
 * on pause or seek, so no note is left hanging. The AudioContext starts on the first click.
 */
export function useReplayPlayer(notes: ReplayNote[]) {
  const audioRef = useRef<HTMLAudioElement>(null);
  const [mode, setModeState] = useState<ListenMode>("both");
  const [level, setLevelState] = useState(INITIAL_LEVEL);
  const [playing, setPlaying] = useState(false);
  const [positionSec, setPositionSec] = useState(0);
  const [durationSec, setDurationSec] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [starting, setStarting] = useState(false);

  const tone = useRef<ToneModule | null>(null);
  const master = useRef<InstanceType<ToneModule["Volume"]> | null>(null);
  const voices = useRef<Voices | null>(null);
  const queue = useRef<ReplayNote[]>([]);
  const next = useRef(0);
  const scheduled = useRef(0);
  const timer = useRef<ReturnType<typeof setInterval> | null>(null);
  const frame = useRef<number | null>(null);
  const modeRef = useRef(mode);
  const notesRef = useRef(notes);
  useEffect(() => {
    notesRef.current = notes;
  }, [notes]);

  const applyLevel = useCallback((m: ListenMode, l: number) => {
    const audio = audioRef.current;
    if (audio) {
      audio.volume = l;
      audio.muted = m === "notes";
    }
    const T = tone.current;
    if (T && master.current) {
      master.current.mute = m === "original" || l <= 0;
      if (l > 0) master.current.volume.value = T.gainToDb(l) - 6; // headroom for chords
    }
  }, []);

  useEffect(() => {
    if (audioRef.current) audioRef.current.volume = INITIAL_LEVEL;
  }, []);

  const releaseVoices = useCallback(() => {
    const v = voices.current;
    voices.current = null;
    if (!v || !tone.current) return;
    v.gain.gain.rampTo(0, 0.04);
    setTimeout(() => {
      v.synth.dispose();
      v.gain.dispose();
    }, 250);
  }, []);

  const stopScheduler = useCallback(() => {
    if (timer.current) clearInterval(timer.current);
    timer.current = null;
    if (frame.current !== null) cancelAnimationFrame(frame.current);
    frame.current = null;
    releaseVoices();
  }, [releaseVoices]);

  const tick = useCallback(() => {
    const T = tone.current;
    const audio = audioRef.current;
    const v = voices.current;
    if (!T || !audio || !v) return;
    const pos = audio.currentTime;
    const now = T.now();
    const q = queue.current;
    while (next.current < q.length && q[next.current]!.onsetSec < pos + LOOKAHEAD_SEC) {
      const n = q[next.current++]!;
      if (n.offsetSec <= pos) continue;
      const start = Math.max(n.onsetSec, pos);
      v.synth.triggerAttackRelease(soundingHz(n.pitch, n.cents), Math.max(0.03, n.offsetSec - start), now + (start - pos), Math.max(0.15, Math.min(1, n.velocity / 127)));
      scheduled.current++;
    }
    // for the browser test and for anyone inspecting the page: how many notes went to the synthesiser
    audio.dataset.notesScheduled = String(scheduled.current);
  }, []);

  /** Fresh voices and a queue from the recording's current position. */
  const startScheduler = useCallback(() => {
    const T = tone.current;
    const audio = audioRef.current;
    if (!T || !audio || !master.current) return;
    stopScheduler();
    const gain = new T.Gain(1).connect(master.current);
    const synth = new T.PolySynth(T.Synth, {
      oscillator: { type: "triangle" },
      envelope: { attack: 0.015, decay: 0.25, sustain: 0.55, release: 0.35 },
    }).connect(gain);
    synth.maxPolyphony = 48;
    voices.current = { synth, gain };
    const pos = audio.currentTime;
    queue.current = notesRef.current.filter((n) => n.offsetSec > pos).sort((a, b) => a.onsetSec - b.onsetSec);
    next.current = 0;
    tick();
    timer.current = setInterval(tick, TICK_MS);
    const follow = () => {
      setPositionSec(audio.currentTime);
      frame.current = requestAnimationFrame(follow);
    };
    frame.current = requestAnimationFrame(follow);
  }, [stopScheduler, tick]);

  const play = useCallback(async () => {
    const audio = audioRef.current;
    if (!audio) return;
    setError(null);
    setStarting(true);
    try {
      if (!tone.current) {
        const T = await import("tone");
        await T.start(); // the AudioContext may only start from a user's click
        tone.current = T;
        master.current = new T.Volume(-12).toDestination();
      } else {
        await tone.current.start();
      }
      applyLevel(modeRef.current, audio.volume);
      await audio.play();
      startScheduler();
      setPlaying(true);
    } catch (e) {
      setError(e instanceof Error && e.name === "NotAllowedError" ? "The browser did not allow playback. Click Play again." : "Playback could not start in this browser.");
      stopScheduler();
      setPlaying(false);
    } finally {
      setStarting(false);
    }
  }, [applyLevel, startScheduler, stopScheduler]);

  const pause = useCallback(() => {
    audioRef.current?.pause();
    stopScheduler();
    setPlaying(false);
    if (audioRef.current) setPositionSec(audioRef.current.currentTime);
  }, [stopScheduler]);

  const seek = useCallback(
    (sec: number) => {
      const audio = audioRef.current;
      if (!audio) return;
      const end = Number.isFinite(audio.duration) ? audio.duration : Infinity;
      audio.currentTime = Math.max(0, Math.min(end, sec));
      setPositionSec(audio.currentTime);
      if (timer.current) startScheduler();
    },
    [startScheduler],
  );

  const setMode = useCallback(
    (m: ListenMode) => {
      modeRef.current = m;
      setModeState(m);
      applyLevel(m, audioRef.current?.volume ?? INITIAL_LEVEL);
    },
    [applyLevel],
  );

  const setLevel = useCallback(
    (l: number) => {
      setLevelState(l);
      applyLevel(modeRef.current, l);
    },
    [applyLevel],
  );

  useEffect(() => {
    const audio = audioRef.current;
    if (!audio) return;
    const onEnded = () => {
      stopScheduler();
      setPlaying(false);
    };
    const onMeta = () => setDurationSec(Number.isFinite(audio.duration) ? audio.duration : null);
    const onError = () => setError("The recording could not be loaded; the notes can still be played.");
    audio.addEventListener("ended", onEnded);
    audio.addEventListener("loadedmetadata", onMeta);
    audio.addEventListener("error", onError);
    return () => {
      audio.removeEventListener("ended", onEnded);
      audio.removeEventListener("loadedmetadata", onMeta);
      audio.removeEventListener("error", onError);
    };
  }, [stopScheduler]);

  useEffect(
    () => () => {
      stopScheduler();
      master.current?.dispose();
    },
    [stopScheduler],
  );

  return { audioRef, mode, setMode, level, setLevel, playing, starting, play, pause, seek, positionSec, durationSec, error };
}
