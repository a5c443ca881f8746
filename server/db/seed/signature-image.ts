/**
 * A demo signature drawn in code: a looped pen stroke on a white 600 × 200 box (the size of the
 * browser's signature pad), written as an 8-bit greyscale PNG with node:zlib. Used by the demo
 * seed for the inspector's signature, so no image file is shipped. Deterministic: the same seed
 * always gives the same bytes.
 *
 * PNG layout (ISO/IEC 15948): the 8-byte signature, then chunks of length, type, data and a
 * CRC-32 over type and data; IHDR, one IDAT of the deflated scanlines (each led by filter byte 0),
 * IEND.
 */
import zlib from 'node:zlib';

const width = 600;
const height = 200;
const ink = 28;
const paper = 255;

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** Encodes greyscale pixels (one byte each, row by row) as a PNG. */
export function greyscalePng(pixels: Uint8Array, w: number, h: number): Buffer {
  if (pixels.length !== w * h) throw new Error(`Expected ${w * h} pixels, got ${pixels.length}`);
  const raw = Buffer.alloc((w + 1) * h);
  for (let y = 0; y < h; y++) {
    raw[y * (w + 1)] = 0; // filter: none
    raw.set(pixels.subarray(y * w, (y + 1) * w), y * (w + 1) + 1);
  }
  const header = Buffer.alloc(13);
  header.writeUInt32BE(w, 0);
  header.writeUInt32BE(h, 4);
  header[8] = 8; // bit depth
  header[9] = 0; // colour type: greyscale
  header[10] = 0; // compression: deflate
  header[11] = 0; // filter method 0
  header[12] = 0; // no interlace
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', zlib.deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/**
 * A handwritten-looking signature: a stroke that runs left to right in loops whose size and
 * slant vary with `seed`, then an underline flourish.
 */
export function demoSignaturePng(seed = 1): Buffer {
  const pixels = new Uint8Array(width * height).fill(paper);
  const dot = (cx: number, cy: number, r: number) => {
    for (let y = Math.floor(cy - r); y <= Math.ceil(cy + r); y++) {
      for (let x = Math.floor(cx - r); x <= Math.ceil(cx + r); x++) {
        if (x < 0 || y < 0 || x >= width || y >= height) continue;
        if ((x - cx) ** 2 + (y - cy) ** 2 <= r * r) pixels[y * width + x] = ink;
      }
    }
  };
  const stroke = (points: Array<[number, number]>, r: number) => {
    for (let i = 1; i < points.length; i++) {
      const [x0, y0] = points[i - 1]!;
      const [x1, y1] = points[i]!;
      const steps = Math.max(1, Math.ceil(Math.hypot(x1 - x0, y1 - y0)));
      for (let s = 0; s <= steps; s++) dot(x0 + ((x1 - x0) * s) / steps, y0 + ((y1 - y0) * s) / steps, r);
    }
  };

  // Loops: a point moving right while circling, with the loop size swelling and shrinking.
  const loops: Array<[number, number]> = [];
  for (let t = 0; t <= 1; t += 0.0015) {
    const angle = t * Math.PI * 2 * (6 + (seed % 3));
    const size = 34 + 18 * Math.sin(t * Math.PI * 3 + seed);
    const x = 60 + t * 440 + size * 0.55 * Math.cos(angle) + 14 * Math.sin(angle) * 0.4;
    const y = 95 - size * Math.sin(angle) * (0.8 + 0.2 * Math.cos(t * 7));
    loops.push([x, y]);
  }
  stroke(loops, 1.8);
  // The underline, rising slightly to the right.
  const line: Array<[number, number]> = [];
  for (let t = 0; t <= 1; t += 0.01) line.push([70 + t * 470, 165 - t * 18 + 4 * Math.sin(t * Math.PI)]);
  stroke(line, 1.4);
  return greyscalePng(pixels, width, height);
}
