/**
 * The one clock. The recording plays through the same AudioContext as the synthesiser (a
 * MediaElementAudioSourceNode), so the two run at the same rate; what is left to know is the
 * constant offset between the recording's position (`audio.currentTime`) and the context's
 * time. Each scheduler tick adds a reading; the offset is the median of the last readings, so one
 * late or stale reading (a busy main thread, a currentTime cached for the task) does not move it.
 * A run of readings far from the median (a stall or a seek the player missed) starts afresh.
 */
export class MediaClock {
  private readings: number[] = [];
  private strays = 0;

  constructor(
    private readonly size = 40,
    private readonly strayLimitSec = 0.05,
  ) {}

  reset(): void {
    this.readings = [];
    this.strays = 0;
  }

  /** One reading: the recording's position and the context's time, read together. */
  add(mediaSec: number, contextSec: number): void {
    const x = mediaSec - contextSec;
    if (this.readings.length >= 5 && Math.abs(x - this.offsetSec()) > this.strayLimitSec) {
      if (++this.strays < 3) return;
      this.reset();
    }
    this.strays = 0;
    this.readings.push(x);
    if (this.readings.length > this.size) this.readings.shift();
  }

  get ready(): boolean {
    return this.readings.length > 0;
  }

  get count(): number {
    return this.readings.length;
  }

  /** recording position − context time (s); the median of the readings kept. */
  offsetSec(): number {
    const n = this.readings.length;
    if (n === 0) return 0;
    const s = [...this.readings].sort((a, b) => a - b);
    return n % 2 ? s[(n - 1) / 2]! : (s[n / 2 - 1]! + s[n / 2]!) / 2;
  }

  mediaAt(contextSec: number): number {
    return contextSec + this.offsetSec();
  }

  contextAt(mediaSec: number): number {
    return mediaSec - this.offsetSec();
  }
}
