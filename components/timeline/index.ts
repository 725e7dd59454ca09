// The take page's time-aligned views and Tapernote's one player (take page and replay page).
export { TakeTimeline, type TakeTimelineProps } from "./TakeTimeline";
export { TimeView, useTimeView, useTimeViewListener, useTimeViewState, TIMELINE_GUTTER_PX, type TimeWindow, type LoopRegion, type TimeViewState } from "./time-view";
export { usePlayback, useSpaceToPlay, isTypingTarget, type Playback } from "./use-playback";
export { PlaybackEngine, type PlaybackProbe, type PlaybackStats, type PlaybackState } from "./playback-engine";
export { soundingHz, mixGains, LISTEN_MODES, INITIAL_LEVEL, type ListenMode } from "./sounding";
export type { PlayNote } from "./schedule";
