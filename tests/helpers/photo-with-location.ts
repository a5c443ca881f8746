/**
 * A JPEG carrying a GPS position the way a phone writes one: an EXIF block (TIFF structure, CIPA
 * DC-008 "Exif 2.3": IFD0 with Orientation 0x0112 and the GPS pointer 0x8825; a GPS directory with
 * GPSLatitudeRef 0x0001, GPSLatitude 0x0002, GPSLongitudeRef 0x0003, GPSLongitude 0x0004 as
 * RATIONALs), an XMP block repeating the position, then a minimal image. The position is invented.
 */
import { jpegHeaderBytes } from './images.ts';

export const invented = { latitude: [52, 12, 3456, 100] as const, longitude: [1, 41, 2345, 100] as const };

export function jpegWithLocation(): Buffer {
  // Little-endian TIFF: header 8 bytes, IFD0 at 8.
  const tiff = Buffer.alloc(200);
  tiff.write('II', 0, 'latin1');
  tiff.writeUInt16LE(42, 2);
  tiff.writeUInt32LE(8, 4);
  // IFD0: 2 entries.
  let o = 8;
  tiff.writeUInt16LE(2, o);
  o += 2;
  tiff.writeUInt16LE(0x0112, o); tiff.writeUInt16LE(3, o + 2); tiff.writeUInt32LE(1, o + 4); tiff.writeUInt16LE(6, o + 8); o += 12; // Orientation 6
  const gpsAt = 8 + 2 + 2 * 12 + 4; // after IFD0's next-IFD pointer
  tiff.writeUInt16LE(0x8825, o); tiff.writeUInt16LE(4, o + 2); tiff.writeUInt32LE(1, o + 4); tiff.writeUInt32LE(gpsAt, o + 8); o += 12;
  tiff.writeUInt32LE(0, o);
  // GPS IFD: 4 entries, values after it.
  o = gpsAt;
  tiff.writeUInt16LE(4, o);
  const valuesAt = gpsAt + 2 + 4 * 12 + 4;
  const entry = (i: number, tag: number, type: number, count: number, value: (at: number) => void) => {
    const e = gpsAt + 2 + i * 12;
    tiff.writeUInt16LE(tag, e); tiff.writeUInt16LE(type, e + 2); tiff.writeUInt32LE(count, e + 4); value(e + 8);
  };
  const rationals = (at: number, [d, m, sNum, sDen]: readonly number[]) => {
    tiff.writeUInt32LE(d!, at); tiff.writeUInt32LE(1, at + 4);
    tiff.writeUInt32LE(m!, at + 8); tiff.writeUInt32LE(1, at + 12);
    tiff.writeUInt32LE(sNum!, at + 16); tiff.writeUInt32LE(sDen!, at + 20);
  };
  entry(0, 0x0001, 2, 2, (at) => tiff.write('N\0', at, 'latin1'));
  entry(1, 0x0002, 5, 3, (at) => tiff.writeUInt32LE(valuesAt, at));
  entry(2, 0x0003, 2, 2, (at) => tiff.write('W\0', at, 'latin1'));
  entry(3, 0x0004, 5, 3, (at) => tiff.writeUInt32LE(valuesAt + 24, at));
  tiff.writeUInt32LE(0, gpsAt + 2 + 4 * 12);
  rationals(valuesAt, invented.latitude);
  rationals(valuesAt + 24, invented.longitude);
  const exif = Buffer.concat([Buffer.from('Exif\0\0', 'latin1'), tiff.subarray(0, valuesAt + 48)]);
  const xmp = Buffer.from('http://ns.adobe.com/xap/1.0/\0<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"><rdf:Description xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="52,12.576N" exif:GPSLongitude="1,41.39W"/></rdf:RDF></x:xmpmeta>', 'latin1');
  const segment = (marker: number, data: Buffer) => {
    const head = Buffer.from([0xff, marker, 0, 0]);
    head.writeUInt16BE(data.length + 2, 2);
    return Buffer.concat([head, data]);
  };
  const jfif = jpegHeaderBytes(); // SOI, APP0 (JFIF), EOI
  return Buffer.concat([jfif.subarray(0, jfif.length - 2), segment(0xe1, exif), segment(0xe1, xmp), Buffer.from([0xff, 0xd9])]);
}
