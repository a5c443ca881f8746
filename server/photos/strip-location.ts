/**
 * Removing location data from a photo before it is stored. A phone's photo of the paper notes
 * usually records where it was taken (EXIF GPS): that is the client's address, or a tester's home,
 * and has no place in the job's record.
 *
 * - JPEG: the EXIF block is kept (orientation, date, camera) but its GPS directory is emptied: its
 *   entries and every value they point at are overwritten with zeros and its entry count set to 0,
 *   so the pointer to it stays valid and nothing of the position remains in the bytes. XMP blocks
 *   (which may repeat the position) and Photoshop/IPTC blocks (which may name a city) are dropped.
 * - PNG: the `eXIf` chunk and the text chunks (`tEXt`, `iTXt`, `zTXt`, where XMP lives) are dropped;
 *   pixel chunks are untouched (chunk CRCs are per chunk, so nothing else needs rewriting).
 *
 * A file whose structure cannot be followed is refused rather than stored with its location.
 */

export interface StripResult {
  bytes: Buffer;
  /** What was removed, in words (empty when the photo carried no location data). */
  removed: string[];
}

export class UnreadablePhotoError extends Error {}

const typeSizes: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8 };

/** Empties the GPS directory of a TIFF structure (EXIF) in place; true if there was one. */
function emptyGpsDirectory(tiff: Buffer): boolean {
  if (tiff.length < 8) throw new UnreadablePhotoError('its EXIF block is cut short');
  const order = tiff.toString('latin1', 0, 2);
  if (order !== 'II' && order !== 'MM') throw new UnreadablePhotoError('its EXIF block has no byte order');
  const le = order === 'II';
  const u16 = (o: number) => (le ? tiff.readUInt16LE(o) : tiff.readUInt16BE(o));
  const u32 = (o: number) => (le ? tiff.readUInt32LE(o) : tiff.readUInt32BE(o));
  const inside = (o: number, n: number) => o >= 0 && o + n <= tiff.length;
  const ifd0 = u32(4);
  if (!inside(ifd0, 2)) throw new UnreadablePhotoError('its EXIF directory lies outside the block');
  const count = u16(ifd0);
  if (!inside(ifd0 + 2, count * 12)) throw new UnreadablePhotoError('its EXIF directory is cut short');
  let gps: number | null = null;
  for (let i = 0; i < count; i++) {
    const entry = ifd0 + 2 + i * 12;
    if (u16(entry) === 0x8825) gps = u32(entry + 8);
  }
  if (gps === null || gps === 0) return false;
  if (!inside(gps, 2)) throw new UnreadablePhotoError('its GPS directory lies outside the EXIF block');
  const n = u16(gps);
  if (!inside(gps + 2, n * 12 + 4)) throw new UnreadablePhotoError('its GPS directory is cut short');
  for (let i = 0; i < n; i++) {
    const entry = gps + 2 + i * 12;
    const size = (typeSizes[u16(entry + 2)] ?? 1) * u32(entry + 4);
    if (size > 4) {
      const at = u32(entry + 8);
      if (inside(at, size)) tiff.fill(0, at, at + size);
    }
  }
  tiff.fill(0, gps, gps + 2 + n * 12 + 4); // count 0, no entries, no next directory
  return true;
}

const EXIF_ID = Buffer.from('Exif\0\0', 'latin1');
const XMP_IDS = ['http://ns.adobe.com/xap/1.0/\0', 'http://ns.adobe.com/xmp/extension/\0'].map((s) => Buffer.from(s, 'latin1'));

function stripJpeg(input: Buffer): StripResult {
  const removed = new Set<string>();
  const parts: Buffer[] = [input.subarray(0, 2)];
  let at = 2;
  while (at < input.length) {
    if (input[at] !== 0xff) throw new UnreadablePhotoError('its JPEG segments could not be followed');
    const marker = input[at + 1]!;
    if (marker === 0xff) {
      at += 1; // fill byte
      continue;
    }
    if (marker === 0xd9 || marker === 0xda) {
      // End of image, or start of scan: the compressed image follows to the end; keep it as it is.
      parts.push(input.subarray(at));
      break;
    }
    if ((marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) {
      parts.push(input.subarray(at, at + 2));
      at += 2;
      continue;
    }
    if (at + 4 > input.length) throw new UnreadablePhotoError('its JPEG segments are cut short');
    const length = input.readUInt16BE(at + 2);
    const end = at + 2 + length;
    if (length < 2 || end > input.length) throw new UnreadablePhotoError('a JPEG segment runs past the end of the file');
    const segment = Buffer.from(input.subarray(at, end)); // a copy: the input is never changed
    const data = segment.subarray(4);
    if (marker === 0xe1 && data.subarray(0, 6).equals(EXIF_ID)) {
      if (emptyGpsDirectory(data.subarray(6))) removed.add('the GPS position in the EXIF data');
      parts.push(segment);
    } else if (marker === 0xe1 && XMP_IDS.some((id) => data.subarray(0, id.length).equals(id))) {
      removed.add('the XMP block (it can repeat the position)');
    } else if (marker === 0xed) {
      removed.add('the IPTC block (it can name the place)');
    } else {
      parts.push(segment);
    }
    at = end;
  }
  return { bytes: Buffer.concat(parts), removed: [...removed] };
}

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const PNG_DROPPED = new Set(['eXIf', 'tEXt', 'iTXt', 'zTXt']);

function stripPng(input: Buffer): StripResult {
  if (!input.subarray(0, 8).equals(PNG_SIGNATURE)) throw new UnreadablePhotoError('it does not start as a PNG does');
  const removed = new Set<string>();
  const parts: Buffer[] = [PNG_SIGNATURE];
  let at = 8;
  while (at < input.length) {
    if (at + 12 > input.length) throw new UnreadablePhotoError('its PNG chunks are cut short');
    const length = input.readUInt32BE(at);
    const type = input.toString('latin1', at + 4, at + 8);
    const end = at + 12 + length;
    if (end > input.length) throw new UnreadablePhotoError('a PNG chunk runs past the end of the file');
    if (PNG_DROPPED.has(type)) removed.add(type === 'eXIf' ? 'the EXIF data (it can hold the GPS position)' : 'text metadata (it can hold XMP with the position)');
    else parts.push(input.subarray(at, end));
    at = end;
    if (type === 'IEND') break;
  }
  return { bytes: Buffer.concat(parts), removed: [...removed] };
}

/** The photo's bytes with location metadata removed. Throws UnreadablePhotoError when it cannot be done safely. */
export function stripLocation(bytes: Buffer, mime: string): StripResult {
  if (mime === 'image/jpeg') return stripJpeg(bytes);
  if (mime === 'image/png') return stripPng(bytes);
  throw new UnreadablePhotoError(`${mime} photos are not taken`);
}
