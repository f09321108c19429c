/** Ingesting a 12-megapixel JPEG (our pipeline) against a bare sharp resize of the same file. */
import sharp from 'sharp';
import { ingestImage } from '../src-api/lots/photos.service';
import { alternate, median, p95, round, type BenchResult } from './lib';

export async function benchPhoto(): Promise<BenchResult> {
  // A 4000×3000 photo-like image: noise over a gradient, so the encoder has real work to do.
  const w = 4000;
  const h = 3000;
  const raw = Buffer.alloc(w * h * 3);
  let s = 1;
  for (let i = 0; i < raw.length; i++) {
    s = (s * 1103515245 + 12345) & 0x7fffffff;
    raw[i] = ((i / 3) % w) / 16 + (s % 40);
  }
  const jpeg = await sharp(raw, { raw: { width: w, height: h, channels: 3 } }).jpeg({ quality: 90 }).withExif({ IFD0: { Make: 'Bench' } }).toBuffer();
  // The floor: the same decode and the two resizes, with no checks, rotation or metadata work.
  const bareIngest = async () => {
    await sharp(jpeg).resize(2048, 2048, { fit: 'inside' }).jpeg({ quality: 82 }).toBuffer();
    await sharp(jpeg).resize(320, 320, { fit: 'inside' }).jpeg({ quality: 72 }).toBuffer();
  };
  // Measured in alternation: run one after the other, the machine's load drifted by 20 % between them.
  const { a: ours, b: bare } = await alternate(10, () => ingestImage(jpeg), bareIngest);
  const ratio = median(ours) / median(bare);
  return {
    name: 'photo ingest, 12-megapixel JPEG',
    floor: 'bare sharp resize of the same file (web copy + thumbnail)',
    target: '≤ 1.2×',
    median: { oursMs: round(median(ours)), bareMs: round(median(bare)) },
    p95: { oursMs: round(p95(ours)), bareMs: round(p95(bare)) },
    ratio,
    met: ratio <= 1.2,
    extra: { bytes: jpeg.length },
  };
}
