// The replay page and the take page share one player (components/timeline).
export { soundingHz, LISTEN_MODES, INITIAL_LEVEL, type ListenMode } from "@/components/timeline/sounding";
