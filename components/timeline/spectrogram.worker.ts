/// <reference lib="webworker" />
// The spectrogram's STFT off the page's thread: columns are posted back in chunks as they are made.
import { ColumnMaker, frameCount, type SpectrogramSpec } from "./spectrogram-columns";

type Request = { id: number; samples: Float32Array; spec: SpectrogramSpec };

const CHUNK = 512;

self.onmessage = (e: MessageEvent<Request>) => {
  const { id, samples, spec } = e.data;
  const maker = new ColumnMaker(spec);
  const total = frameCount(samples.length, spec.hopSamples);
  for (let from = 0; from < total; from += CHUNK) {
    const to = Math.min(total, from + CHUNK);
    const data = new Uint8Array((to - from) * maker.bandCount);
    maker.columns(samples, from, to, data);
    (self as unknown as Worker).postMessage({ id, from, to, total, bands: maker.bandCount, data }, [data.buffer]);
  }
};
