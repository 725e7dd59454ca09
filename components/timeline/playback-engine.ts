"use client";
/**
 * Tapernote's one player, for the take page and the replay page: the original recording and the
 * notes resynthesised with Tone.js, on one clock.
 *
 * - The recording is an <audio> element (it streams with byte ranges, so a long take needs no
 *   full decode to play) routed into Tone's AudioContext through a MediaElementAudioSourceNode.
 *   The context then pulls the recording's samples itself, so the recording and the synthesiser
 *   run at the same rate and go out through the same output; the element is muted in no mode,
 *   its gain is set in the graph.
 * - The clock is the AudioContext's. `MediaClock` keeps the offset between the recording's
 *   position and the context's time (median of readings each tick); a scheduler every 25 ms
 *   hands the notes of the next 150 ms to a PolySynth at their exact context times
 *   (`contextAt(onsetSec)`), and every animation frame the playhead is set to the position
 *   being heard (the context's output timestamp, so output latency is taken off).
 * - A loop wraps by seeking the element to the loop's start; the clock is re-read and the notes
 *   sounding there start at once.
 *
 * The engine is a plain class (no React): the hook in use-playback.ts adapts it.
 */
import { MediaClock } from "./clock";
import { followLoop, notesSoundingAt, notesStartingIn, sortByOnset, type NoteStart, type PlayNote } from "./schedule";
import { INITIAL_LEVEL, mixGains, soundingHz, type ListenMode } from "./sounding";
import { DEFAULT_SYNTH_VOICE, makeSynth, type AnyPolySynth, type SynthVoiceId } from "./synth-voices";
import type { TimeView } from "./time-view";

type ToneModule = typeof import("tone");
type ToneGain = InstanceType<ToneModule["Gain"]>;

/**
 * How far ahead of the recording notes are handed to the synthesiser, and how often (s). The
 * synthesiser starts each at its exact context time however early it got it, so the lookahead
 * only has to outlast the longest stall of the page's thread (a big re-render, a garbage
 * collection: a few hundred ms on a busy machine) — and an edit to a note less than this far
 * ahead is heard from the next pass.
 */
export const LOOKAHEAD_SEC = 0.5;
export const TICK_SEC = 0.025;

export const CAUTION_STORAGE_KEY = "tapernote.hearing-caution-seen";

export type PlaybackState = {
  playing: boolean;
  /** Play was pressed and the audio is starting (context, recording). */
  starting: boolean;
  mode: ListenMode;
  /** −1 recording only … 0 both … +1 notes only (in `both`). */
  balance: number;
  /** Master level 0…1 (starts at 25 %). */
  level: number;
  voice: SynthVoiceId;
  /** Why playback could not start, for the person listening. */
  error: string | null;
  /** The recording could not be loaded (the notes can still be played). */
  audioError: boolean;
  /** Length of the recording as the element reports it, once known. */
  durationSec: number | null;
  /** Show the hearing caution (the first play on this browser). */
  caution: boolean;
};

/** Timing figures for the browser test and for anyone inspecting the page (ms). */
export type PlaybackStats = {
  /** Animation frames measured while playing. */
  frames: number;
  /** |playhead + output latency (smoothed) − audio.currentTime|: the clock mapping against the element's own clock. */
  playheadMaxMs: number;
  playheadMeanMs: number;
  /** Where in the recording (s) the largest playhead error was seen. */
  playheadMaxAtSec: number;
  /** Notes handed to the synthesiser. */
  notes: number;
  /** How late after its time a note reached the synthesiser (0 when ahead, as it should be). */
  lateMaxMs: number;
  lateCount: number;
  /** Notes checked after they sounded: |recording position at the note's context time − onset|. */
  checked: number;
  noteErrorMaxMs: number;
  noteErrorMeanMs: number;
  /** Output latency the playhead takes off (ms), last value. */
  latencyMs: number;
  /**
   * Times the page's thread was blocked for more than 100 ms (a scheduler tick or an animation
   * frame that late), and the longest. Notes are counted through lateness.
   */
  stalls: number;
  longestStallMs: number;
  /**
   * Frames left out of the playhead figures: those within 250 ms after a frame came more than
   * 50 ms late (the page drew nothing meanwhile, and the element's own position, read from the
   * media thread, can lag for a moment after such a gap).
   */
  settlingFrames: number;
  /** Frames where the playhead was 20 ms or more from the element's clock. */
  playheadOver20: number;
  /** Frames where the playhead was more than 10 ms from the element's clock: [recording s, ms, ms since the frame before] (the first 40). */
  spikes: [number, number, number][];
};

/** The read-only probe on window.__tapernotePlayback (see TakeTimeline's TSDoc). */
export type PlaybackProbe = {
  /** The recording element's position (its own clock), s. */
  audioSec(): number;
  /** The playhead as last drawn, s. */
  playheadSec(): number;
  /** The AudioContext's time, s (0 before the first play). */
  contextSec(): number;
  playing(): boolean;
  mode(): ListenMode;
  /** Notes handed to the synthesiser since the page opened. */
  notesScheduled(): number;
  /** Output latency the playhead takes off (s). */
  latencySec(): number;
  /**
   * The last ~0.74 s of what the graph rendered (44.1 kHz), the recording's and the notes' buses
   * apart, with the context time of the newest sample: for measuring the audible sync of notes
   * and recording from the output itself. Taps the buses (two AnalyserNodes, which change nothing
   * that is heard) on the first call; null before playback. The two taps are read one after the
   * other while the audio thread renders on, so the recording's tap is read again after the
   * notes'; `sameInstant` is false when the audio thread rendered in between on every one of a
   * few tries (on a busy machine it can render several buffers at once, tens of ms, which would
   * show as a false offset between the buses).
   */
  heard(): { sampleRateHz: number; endContextSec: number; original: number[]; notes: number[]; sameInstant: boolean } | null;
  /** The shared time window (startSec at the gutter's edge, pxPerSec) and the loop. */
  timeWindow(): { startSec: number; pxPerSec: number; loop: { startSec: number; endSec: number } | null };
  /** The graph's gains now: recording, notes (after the listen mode and balance), master level. */
  gains(): { original: number; notes: number; master: number } | null;
  stats(): PlaybackStats;
  resetStats(): void;
};

declare global {
  interface Window {
    __tapernotePlayback?: PlaybackProbe;
  }
}

function emptyStats(): PlaybackStats {
  return { frames: 0, playheadMaxMs: 0, playheadMeanMs: 0, playheadMaxAtSec: 0, notes: 0, lateMaxMs: 0, lateCount: 0, checked: 0, noteErrorMaxMs: 0, noteErrorMeanMs: 0, latencyMs: 0, stalls: 0, longestStallMs: 0, settlingFrames: 0, playheadOver20: 0, spikes: [] };
}

function cautionSeen(): boolean {
  try {
    return window.localStorage.getItem(CAUTION_STORAGE_KEY) === "1";
  } catch {
    return false;
  }
}

type Graph = { T: ToneModule; raw: BaseAudioContext & { getOutputTimestamp?: () => AudioTimestamp; outputLatency?: number; baseLatency?: number }; original: ToneGain; notes: ToneGain; master: ToneGain };
type Voices = { synth: AnyPolySynth; gain: ToneGain };

/** The source node of each element routed so far (an element can have only one, ever). */
const sources = new WeakMap<HTMLMediaElement, MediaElementAudioSourceNode>();

export class PlaybackEngine {
  private state: PlaybackState = {
    playing: false,
    starting: false,
    mode: "both",
    balance: 0,
    level: INITIAL_LEVEL,
    voice: DEFAULT_SYNTH_VOICE,
    error: null,
    audioError: false,
    durationSec: null,
    caution: false,
  };
  private listeners = new Set<() => void>();
  private audio: HTMLAudioElement | null = null;
  private detachAudio: (() => void) | null = null;
  private graph: Graph | null = null;
  private voices: Voices | null = null;
  private sorted: PlayNote[] = [];
  private clock = new MediaClock();
  /** Recording time up to which notes were handed over; null: (re)start pending. */
  private scheduledUntil: number | null = null;
  private timer: ReturnType<typeof setInterval> | null = null;
  private wrapTimer: ReturnType<typeof setTimeout> | null = null;
  private frame: number | null = null;
  private scheduledTotal = 0;
  private stats = emptyStats();
  private checks: { when: number; onsetSec: number }[] = [];
  private playheadErrSum = 0;
  private noteErrSum = 0;
  private disposed = false;
  private lastReading = -1;
  private lastTickMs: number | null = null;
  private lastFrameMs: number | null = null;
  private settleUntilMs = 0;
  /** Playback is inside the loop region (and wraps at its end). */
  private inLoop = false;
  private latencySmoothSec: number | null = null;

  constructor(private readonly view: TimeView) {}

  /** Mounted: take the time view's seeks and put the probe on the page (again, after a dispose). */
  activate(): void {
    this.disposed = false;
    this.view.onSeek((sec) => this.seek(sec));
    if (typeof window !== "undefined") window.__tapernotePlayback = this.probe();
  }

  get(): PlaybackState {
    return this.state;
  }

  subscribe(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  private set(patch: Partial<PlaybackState>): void {
    this.state = { ...this.state, ...patch };
    for (const l of this.listeners) l();
  }

  /** The notes as currently edited; the scheduler reads the latest list on its next tick. */
  setNotes(notes: readonly PlayNote[]): void {
    const had = this.sorted.length > 0;
    this.sorted = sortByOnset(notes);
    if (had !== this.sorted.length > 0) this.applyGains();
  }

  /** With no notes (none yet, or all deleted) there is only the recording to hear. */
  effectiveMode(): ListenMode {
    return this.sorted.length > 0 ? this.state.mode : "original";
  }

  attach(audio: HTMLAudioElement | null): void {
    if (audio === this.audio) return;
    this.detachAudio?.();
    this.detachAudio = null;
    this.audio = audio;
    if (!audio) return;
    audio.volume = this.graph ? 1 : this.state.level;
    const onEnded = () => {
      this.stopRunning();
      this.set({ playing: false });
      this.view.setPlayhead(audio.currentTime);
    };
    const onMeta = () => this.set({ durationSec: Number.isFinite(audio.duration) ? audio.duration : null, audioError: false });
    const onError = () => this.set({ audioError: true });
    const onWaiting = () => this.restartNotes();
    const onPause = () => {
      // paused from outside (the system's media keys): follow it
      if (this.state.playing && !this.wrapping) {
        this.stopRunning();
        this.set({ playing: false });
      }
    };
    audio.addEventListener("ended", onEnded);
    audio.addEventListener("loadedmetadata", onMeta);
    audio.addEventListener("error", onError);
    audio.addEventListener("waiting", onWaiting);
    audio.addEventListener("pause", onPause);
    if (audio.readyState >= 1) onMeta();
    if (audio.error) onError();
    this.detachAudio = () => {
      audio.removeEventListener("ended", onEnded);
      audio.removeEventListener("loadedmetadata", onMeta);
      audio.removeEventListener("error", onError);
      audio.removeEventListener("waiting", onWaiting);
      audio.removeEventListener("pause", onPause);
    };
  }

  /** Loads the recording again after an error. */
  reload(): void {
    this.set({ audioError: false, error: null });
    this.audio?.load();
  }

  private wrapping = false;

  async play(): Promise<void> {
    const audio = this.audio;
    if (!audio || this.state.playing || this.state.starting) return;
    this.set({ starting: true, error: null });
    try {
      await this.ensureGraph(audio);
      if (!cautionSeen()) {
        try {
          window.localStorage.setItem(CAUTION_STORAGE_KEY, "1");
        } catch {
          // private mode: the caution shows once per page instead
        }
        this.set({ caution: true });
      }
      const end = Number.isFinite(audio.duration) ? audio.duration : Infinity;
      if (audio.currentTime >= end - 0.01) audio.currentTime = 0;
      this.applyGains(0);
      await audio.play();
      if (this.disposed) return;
      this.startRunning();
      this.set({ playing: true, starting: false });
    } catch (e) {
      this.stopRunning();
      const name = e instanceof Error ? e.name : "";
      this.set({
        playing: false,
        starting: false,
        error: name === "NotAllowedError" ? "The browser did not allow playback. Click Play again." : this.state.audioError ? "The recording could not be loaded." : "Playback could not start in this browser.",
      });
    }
  }

  pause(): void {
    this.audio?.pause();
    this.stopRunning();
    this.set({ playing: false });
    if (this.audio) this.view.setPlayhead(this.audio.currentTime);
  }

  toggle(): void {
    if (this.state.playing) this.pause();
    else void this.play();
  }

  seek(sec: number): void {
    const audio = this.audio;
    const length = this.state.durationSec ?? this.view.get().durationSec;
    const t = Math.max(0, Math.min(length || Infinity, sec));
    if (audio) audio.currentTime = t;
    const loop = this.view.get().loop;
    this.inLoop = !!loop && t >= loop.startSec && t < loop.endSec;
    this.view.setPlayhead(t);
    if (this.state.playing) this.restartNotes();
  }

  setMode(mode: ListenMode): void {
    this.set({ mode });
    this.applyGains();
  }

  setBalance(balance: number): void {
    this.set({ balance: Math.max(-1, Math.min(1, balance)) });
    this.applyGains();
  }

  setLevel(level: number): void {
    this.set({ level: Math.max(0, Math.min(1, level)) });
    if (this.audio && !this.graph) this.audio.volume = this.state.level;
    this.applyGains();
  }

  setVoice(voice: SynthVoiceId): void {
    if (voice === this.state.voice) return;
    this.set({ voice });
    if (this.state.playing) this.restartNotes();
  }

  dismissCaution(): void {
    this.set({ caution: false });
  }

  dispose(): void {
    this.disposed = true;
    this.stopRunning();
    this.detachAudio?.();
    this.audio?.pause();
    this.view.onSeek(null);
    if (typeof window !== "undefined" && this.probeRef && window.__tapernotePlayback === this.probeRef) delete window.__tapernotePlayback;
    const g = this.graph;
    this.graph = null;
    if (g) {
      g.original.dispose();
      g.notes.dispose();
      g.master.dispose();
    }
  }

  // --- the graph -----------------------------------------------------------------------

  private async ensureGraph(audio: HTMLAudioElement): Promise<Graph> {
    if (this.graph) {
      await this.graph.T.start();
      return this.graph;
    }
    const T = await import("tone");
    await T.start(); // the AudioContext may only start from a person's click or key
    const ctx = T.getContext();
    const master = new T.Gain(this.state.level).toDestination();
    const original = new T.Gain(0).connect(master);
    const notes = new T.Gain(0).connect(master);
    // One element can feed one source node for its lifetime; the element's own volume is left at 1.
    let source = sources.get(audio);
    if (!source) {
      source = ctx.createMediaElementSource(audio);
      sources.set(audio, source);
    }
    T.connect(source, original);
    audio.volume = 1;
    this.graph = { T, raw: ctx.rawContext as Graph["raw"], original, notes, master };
    return this.graph;
  }

  private applyGains(rampSec = 0.03): void {
    const g = this.graph;
    if (!g) return;
    const { original, notes } = mixGains(this.effectiveMode(), this.state.balance);
    const now = g.raw.currentTime;
    const set = (gain: ToneGain, v: number) => {
      if (rampSec > 0) gain.gain.rampTo(v, rampSec, now);
      else gain.gain.setValueAtTime(v, now);
    };
    set(g.original, original);
    set(g.notes, notes * 0.5); // headroom for chords
    set(g.master, this.state.level);
  }

  private freshVoices(): void {
    this.releaseVoices();
    const g = this.graph;
    if (!g) return;
    const gain = new g.T.Gain(1).connect(g.notes);
    const synth = makeSynth(g.T, this.state.voice).connect(gain);
    this.voices = { synth, gain };
  }

  /** Fades the sounding notes out (a seek, a pause, a wrap) and drops the voices. */
  private releaseVoices(): void {
    const v = this.voices;
    this.voices = null;
    if (!v || !this.graph) return;
    v.gain.gain.rampTo(0, 0.03);
    setTimeout(() => {
      v.synth.dispose();
      v.gain.dispose();
    }, 200);
  }

  // --- running -------------------------------------------------------------------------

  private startRunning(): void {
    this.stopTimers();
    this.clock.reset();
    this.lastReading = this.audio?.currentTime ?? -1;
    const loop = this.view.get().loop;
    const at = this.audio?.currentTime ?? 0;
    this.inLoop = !!loop && at >= loop.startSec && at < loop.endSec;
    this.scheduledUntil = null;
    this.freshVoices();
    this.timer = setInterval(() => this.tick(), TICK_SEC * 1000);
    this.tick();
    const follow = () => {
      this.drawPlayhead();
      this.frame = requestAnimationFrame(follow);
    };
    this.frame = requestAnimationFrame(follow);
  }

  private stopTimers(): void {
    this.lastTickMs = null;
    this.lastFrameMs = null;
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    if (this.wrapTimer) clearTimeout(this.wrapTimer);
    this.wrapTimer = null;
    if (this.frame !== null) cancelAnimationFrame(this.frame);
    this.frame = null;
  }

  private stopRunning(): void {
    this.stopTimers();
    this.releaseVoices();
    this.checks = [];
  }

  /** After a seek, a wrap, a stall or a voice change: read the clock again, start what sounds there. */
  private restartNotes(): void {
    if (!this.state.playing) return;
    if (this.wrapTimer) clearTimeout(this.wrapTimer);
    this.wrapTimer = null;
    this.clock.reset();
    // the position just set is not a reading: wait until the element moves on from it
    this.lastReading = this.audio?.currentTime ?? -1;
    this.scheduledUntil = null;
    this.checks = [];
    this.freshVoices();
  }

  private tick(): void {
    const audio = this.audio;
    const g = this.graph;
    if (!audio || !g) return;
    const ctxNow = g.raw.currentTime;
    const mediaNow = audio.currentTime;
    this.noteStall(this.lastTickMs);
    this.lastTickMs = performance.now();
    // a position that has not moved since the last tick is stale (the element not yet started, or cached)
    const reading = !audio.paused && !audio.seeking && audio.readyState >= 3 && mediaNow !== this.lastReading;
    this.lastReading = mediaNow;
    if (reading) this.clock.add(mediaNow, ctxNow);
    if (!this.clock.ready) return;
    if (reading) this.checkNotes(mediaNow, ctxNow);
    const pos = this.clock.mediaAt(ctxNow);
    const loop = this.view.get().loop;
    const follow = followLoop(this.inLoop, pos, loop);
    this.inLoop = follow.inside;
    // past the loop's end by the clock or by the element's own position: wrap now
    if (loop && (follow.wrap || (this.inLoop && reading && mediaNow >= loop.endSec))) {
      this.wrap();
      return;
    }
    const cut = loop && this.inLoop ? loop.endSec : Infinity;

    if (this.scheduledUntil === null) {
      for (const s of notesSoundingAt(this.sorted, pos, cut)) this.hand(s, ctxNow);
      this.scheduledUntil = pos + 1e-6;
    }
    const to = Math.min(pos + LOOKAHEAD_SEC, cut);
    if (to > this.scheduledUntil) {
      for (const s of notesStartingIn(this.sorted, this.scheduledUntil, to, cut)) this.hand(s, ctxNow);
      this.scheduledUntil = to;
    }
    // wrap at the loop's end, on time: a timer for the exact moment once it is near
    if (loop && this.inLoop && !this.wrapTimer && pos + 2 * TICK_SEC >= loop.endSec) {
      const inMs = Math.max(0, (this.clock.contextAt(loop.endSec) - ctxNow) * 1000);
      this.wrapTimer = setTimeout(() => this.wrap(), inMs);
    }
  }

  private wrap(): void {
    if (this.wrapTimer) clearTimeout(this.wrapTimer);
    this.wrapTimer = null;
    const loop = this.view.get().loop;
    const audio = this.audio;
    if (!loop || !audio || !this.state.playing) return;
    this.inLoop = true;
    this.wrapping = true;
    audio.currentTime = loop.startSec;
    this.wrapping = false;
    this.view.setPlayhead(loop.startSec);
    this.restartNotes();
  }

  private hand(s: NoteStart, ctxNow: number): void {
    const v = this.voices;
    if (!v) return;
    const when = this.clock.contextAt(s.startSec);
    const lateSec = ctxNow - when;
    const at = Math.max(when, ctxNow);
    const velocity = Math.max(0.15, Math.min(1, s.note.velocity / 127));
    v.synth.triggerAttackRelease(soundingHz(s.note.pitch, s.note.cents), Math.max(0.03, s.durationSec - (at - when)), at, velocity);
    this.scheduledTotal++;
    const st = this.stats;
    st.notes++;
    // a note started at once after a seek is late by design; only onsets count
    if (s.startSec === s.note.onsetSec) {
      if (lateSec > 0.001) {
        st.lateCount++;
        st.lateMaxMs = Math.max(st.lateMaxMs, lateSec * 1000);
      }
      this.checks.push({ when: at, onsetSec: s.note.onsetSec + (at - when) });
    }
    if (this.audio) this.audio.dataset.notesScheduled = String(this.scheduledTotal);
  }

  /** For notes whose time has passed: where was the recording (by its own clock) when they started? */
  private checkNotes(mediaSec: number, ctxNow: number): void {
    if (this.checks.length === 0) return;
    const st = this.stats;
    let i = 0;
    for (; i < this.checks.length; i++) {
      const c = this.checks[i]!;
      if (c.when > ctxNow - 0.005) break;
      const err = Math.abs(mediaSec - (ctxNow - c.when) - c.onsetSec) * 1000;
      st.checked++;
      this.noteErrSum += err;
      st.noteErrorMaxMs = Math.max(st.noteErrorMaxMs, err);
      st.noteErrorMeanMs = this.noteErrSum / st.checked;
    }
    if (i) this.checks.splice(0, i);
  }

  /** The position being heard now (s), or null before the clock is read. */
  private heardSec(): { sec: number; latencySec: number } | null {
    const g = this.graph;
    if (!g || !this.clock.ready) return null;
    let heardCtx = g.raw.currentTime - ((g.raw.baseLatency ?? 0) + (g.raw.outputLatency ?? 0));
    const ts = g.raw.getOutputTimestamp?.();
    if (ts && ts.contextTime !== undefined && ts.performanceTime !== undefined && ts.contextTime > 0) {
      heardCtx = ts.contextTime + Math.max(0, performance.now() - ts.performanceTime) / 1000;
    }
    heardCtx = Math.min(heardCtx, g.raw.currentTime);
    const latencySec = g.raw.currentTime - heardCtx;
    // the first readings after a start: the element's own position, until the median has a few
    if (this.clock.count < 3 && this.audio) return { sec: this.audio.currentTime - latencySec, latencySec };
    return { sec: this.clock.mediaAt(heardCtx), latencySec };
  }

  /** Counts a stall when more than 100 ms passed since `sinceMs` (a tick or a frame). */
  private noteStall(sinceMs: number | null): boolean {
    if (sinceMs === null) return false;
    const gapMs = performance.now() - sinceMs;
    if (gapMs <= 100) return false;
    this.stats.stalls++;
    this.stats.longestStallMs = Math.max(this.stats.longestStallMs, gapMs);
    return true;
  }

  private drawPlayhead(): void {
    const audio = this.audio;
    if (!audio || !this.state.playing) return;
    const nowMs = performance.now();
    const gapMs = this.lastFrameMs === null ? 0 : nowMs - this.lastFrameMs;
    if (gapMs > 50) this.settleUntilMs = nowMs + 250;
    const settling = nowMs < this.settleUntilMs;
    this.lastFrameMs = nowMs;
    const heard = this.heardSec();
    if (!heard) return;
    const loop = this.view.get().loop;
    let sec = Math.max(0, heard.sec);
    // just after a wrap the heard position is still before the loop's start for a moment
    if (loop && sec < loop.startSec && audio.currentTime >= loop.startSec && audio.currentTime < loop.endSec) sec = loop.startSec;
    this.view.setPlayhead(sec);
    // the output latency, smoothed: ctx.currentTime moves in steps of the output's buffer, the
    // output timestamp smoothly, so their difference saws up and down by a buffer's length
    this.latencySmoothSec = this.latencySmoothSec === null ? heard.latencySec : this.latencySmoothSec + 0.02 * (heard.latencySec - this.latencySmoothSec);
    const end = Number.isFinite(audio.duration) ? audio.duration : Infinity;
    const measurable = !audio.paused && !audio.seeking && !audio.ended && audio.currentTime < end - 0.05 && audio.readyState >= 3;
    if (measurable && settling) this.stats.settlingFrames++;
    if (measurable && !settling) {
      const err = Math.abs(sec + this.latencySmoothSec - audio.currentTime) * 1000;
      const st = this.stats;
      st.frames++;
      this.playheadErrSum += err;
      if (err >= 20) st.playheadOver20++;
      if (err > 10 && st.spikes.length < 40) st.spikes.push([+audio.currentTime.toFixed(3), +err.toFixed(1), +gapMs.toFixed(1)]);
      if (err > st.playheadMaxMs) {
        st.playheadMaxMs = err;
        st.playheadMaxAtSec = audio.currentTime;
      }
      st.playheadMeanMs = this.playheadErrSum / st.frames;
      st.latencyMs = this.latencySmoothSec * 1000;
    }
  }

  private probeRef: PlaybackProbe | null = null;
  private taps: { original: AnalyserNode; notes: AnalyserNode } | null = null;

  private probe(): PlaybackProbe {
    this.probeRef = {
      audioSec: () => this.audio?.currentTime ?? 0,
      playheadSec: () => this.view.get().playheadSec,
      contextSec: () => this.graph?.raw.currentTime ?? 0,
      playing: () => this.state.playing,
      mode: () => this.effectiveMode(),
      notesScheduled: () => this.scheduledTotal,
      latencySec: () => this.latencySmoothSec ?? 0,
      timeWindow: () => ({ ...this.view.get().window, loop: this.view.get().loop }),
      heard: () => {
        const g = this.graph;
        if (!g) return null;
        if (!this.taps) {
          const make = () => {
            const a = g.raw.createAnalyser();
            a.fftSize = 32768;
            return a;
          };
          this.taps = { original: make(), notes: make() };
          g.T.connect(g.original, this.taps.original);
          g.T.connect(g.notes, this.taps.notes);
        }
        const o = new Float32Array(this.taps.original.fftSize);
        const again = new Float32Array(this.taps.original.fftSize);
        const n = new Float32Array(this.taps.notes.fftSize);
        let endContextSec = 0;
        let sameInstant = false;
        for (let attempt = 0; attempt < 8 && !sameInstant; attempt++) {
          endContextSec = g.raw.currentTime;
          this.taps.original.getFloatTimeDomainData(o);
          this.taps.notes.getFloatTimeDomainData(n);
          this.taps.original.getFloatTimeDomainData(again);
          sameInstant = o.every((x, i) => x === again[i]);
        }
        return { sampleRateHz: g.raw.sampleRate, endContextSec, original: Array.from(o), notes: Array.from(n), sameInstant };
      },
      gains: () => (this.graph ? { original: this.graph.original.gain.value, notes: this.graph.notes.gain.value, master: this.graph.master.gain.value } : null),
      stats: () => ({ ...this.stats, spikes: [...this.stats.spikes] }),
      resetStats: () => {
        this.stats = emptyStats();
        this.playheadErrSum = 0;
        this.noteErrSum = 0;
      },
    };
    return this.probeRef;
  }
}
