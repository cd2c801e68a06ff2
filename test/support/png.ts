/**
 * Minimal PNG reader for the browser tests' screenshots (PNG specification, W3C 2003, §§ 7–9:
 * zlib-compressed scanlines, filter types 0–4, 8-bit RGB or RGBA, no interlace — what Chromium
 * writes). Gives RGBA pixels, so a test can measure what was drawn without an image library.
 */
import { inflateSync } from 'node:zlib';

export interface Rgba {
  readonly width: number;
  readonly height: number;
  readonly data: Uint8Array; // RGBA
}

export function readPng(buf: Uint8Array): Rgba {
  const sig = [137, 80, 78, 71, 13, 10, 26, 10];
  if (!sig.every((b, i) => buf[i] === b)) throw new Error('not a PNG');
  const view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  let off = 8, width = 0, height = 0, colourType = 0;
  const idat: Uint8Array[] = [];
  while (off < buf.length) {
    const len = view.getUint32(off);
    const type = String.fromCharCode(...buf.subarray(off + 4, off + 8));
    const body = buf.subarray(off + 8, off + 8 + len);
    if (type === 'IHDR') {
      width = view.getUint32(off + 8);
      height = view.getUint32(off + 12);
      const depth = body[8], interlace = body[12];
      colourType = body[9]!;
      if (depth !== 8 || interlace !== 0 || (colourType !== 2 && colourType !== 6)) {
        throw new Error(`unsupported PNG: depth ${depth}, colour type ${colourType}, interlace ${interlace}`);
      }
    } else if (type === 'IDAT') idat.push(body);
    else if (type === 'IEND') break;
    off += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const bpp = colourType === 6 ? 4 : 3;
  const stride = width * bpp;
  const cur = new Uint8Array(stride), prev = new Uint8Array(stride);
  const out = new Uint8Array(width * height * 4);
  for (let y = 0; y < height; y++) {
    const f = raw[y * (stride + 1)]!;
    const line = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1));
    for (let i = 0; i < stride; i++) {
      const a = i >= bpp ? cur[i - bpp]! : 0, b = prev[i]!, c = i >= bpp ? prev[i - bpp]! : 0;
      let pred = 0;
      if (f === 1) pred = a;
      else if (f === 2) pred = b;
      else if (f === 3) pred = (a + b) >> 1;
      else if (f === 4) {
        const p = a + b - c, pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
        pred = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      }
      cur[i] = (line[i]! + pred) & 0xff;
    }
    for (let x = 0; x < width; x++) {
      out[4 * (y * width + x)] = cur[x * bpp]!;
      out[4 * (y * width + x) + 1] = cur[x * bpp + 1]!;
      out[4 * (y * width + x) + 2] = cur[x * bpp + 2]!;
      out[4 * (y * width + x) + 3] = bpp === 4 ? cur[x * bpp + 3]! : 255;
    }
    prev.set(cur);
  }
  return { width, height, data: out };
}

/** Variance of the luma (Rec. 601 weights) over all pixels: 0 for a blank image. */
export function lumaVariance(img: Rgba): number {
  let s = 0, s2 = 0;
  const n = img.width * img.height;
  for (let i = 0; i < n; i++) {
    const y = 0.299 * img.data[4 * i]! + 0.587 * img.data[4 * i + 1]! + 0.114 * img.data[4 * i + 2]!;
    s += y;
    s2 += y * y;
  }
  return s2 / n - (s / n) ** 2;
}

/** Share of pixels whose RGB differs by more than `tol` in any channel between two same-sized images. */
export function changedFraction(a: Rgba, b: Rgba, tol = 8): number {
  if (a.width !== b.width || a.height !== b.height) throw new Error('images differ in size');
  let n = 0;
  for (let i = 0; i < a.width * a.height; i++) {
    for (let c = 0; c < 3; c++) {
      if (Math.abs(a.data[4 * i + c]! - b.data[4 * i + c]!) > tol) {
        n++;
        break;
      }
    }
  }
  return n / (a.width * a.height);
}
