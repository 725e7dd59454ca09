import { afterAll, describe, expect, it } from "vitest";
import { checkAudioOffThread, stopDecodeThread } from "@/lib/api/decode-thread";
import { decodeAudio, EngineError } from "@/lib/engine";
import { toneWav } from "../../support/audio";

afterAll(() => stopDecodeThread());

describe("the upload check on its own thread", () => {
  it("answers what the engine's decoder reads in this thread, for several uploads at once", async () => {
    const files = [
      toneWav({ freqsHz: [440], durationSec: 1.5, sampleRateHz: 44100, channels: 2 }),
      toneWav({ freqsHz: [261.63, 329.63], durationSec: 2, sampleRateHz: 22050, bitDepth: "32f" }),
      toneWav({ freqsHz: [110], durationSec: 0.75, sampleRateHz: 48000 }),
    ];
    const checks = await Promise.all(files.map((bytes) => checkAudioOffThread(bytes, 60)));
    for (const [i, bytes] of files.entries()) {
      const here = await decodeAudio(bytes);
      expect(checks[i]).toEqual({ durationSec: here.durationSec, sourceRateHz: here.sourceRateHz, channels: here.channels });
    }
  });

  it("rejects bad audio with the engine's own error code", async () => {
    const wav = toneWav({ freqsHz: [440], durationSec: 1, sampleRateHz: 22050 });
    await expect(checkAudioOffThread(wav.slice(0, 30), 60)).rejects.toSatisfy((e) => e instanceof EngineError && e.code === "truncated");
    await expect(checkAudioOffThread(new TextEncoder().encode("not audio at all"), 60)).rejects.toSatisfy(
      (e) => e instanceof EngineError && e.code === "not_audio",
    );
    await expect(checkAudioOffThread(wav, 0.5)).rejects.toSatisfy((e) => e instanceof EngineError && e.code === "too_long");
  });

  it("starts a new thread after the old one stopped", async () => {
    await stopDecodeThread();
    const check = await checkAudioOffThread(toneWav({ freqsHz: [330], durationSec: 0.5, sampleRateHz: 16000 }), 60);
    expect(check).toEqual({ durationSec: 0.5, sourceRateHz: 16000, channels: 1 });
  });
});
