import { deflateSync } from 'node:zlib';

const crcTable = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
const crc = (buf: Buffer) => {
  let c = 0xffffffff;
  for (const b of buf) c = crcTable[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
};
const chunk = (type: string, data: Buffer) => {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const c = Buffer.alloc(4);
  c.writeUInt32BE(crc(td));
  return Buffer.concat([len, td, c]);
};

/**
 * A PNG of width × height RGB pixels of one shade, built from the format's own chunks (PNG spec,
 * ISO/IEC 15948: signature, IHDR with width and height as 4-byte big-endian, IDAT, IEND). Up to a
 * million pixels the image data is real; above that only the header is (as a hostile upload would
 * be: the size is read from IHDR, the pixels are never decoded).
 */
export function pngOf(width: number, height: number, shade = 200) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 2, 0, 0, 0], 8); // 8 bits per sample, truecolour, deflate, no filter, no interlace
  const row = Buffer.concat([Buffer.from([0]), Buffer.alloc(width * 3, shade)]);
  const pixels =
    width * height <= 1_000_000
      ? Buffer.concat(Array.from({ length: height }, () => row))
      : Buffer.from([0, 255, shade, 0]);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(pixels)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** A real 1×1 PNG. */
export const tinyPng = () => pngOf(1, 1);

/**
 * The header of a JPEG of width × height (ITU-T T.81 Annex B: SOI, a JFIF APP0 segment, a DQT
 * segment, then the frame header SOF0 (baseline) or SOF2 (progressive) with sample precision, number
 * of lines (height) and samples per line (width) as 2-byte big-endian, after two fill bytes (§B.1.1.2);
 * EOI). Enough for type and size to be read from it; it decodes to nothing.
 */
export function jpegHeaderOf(width: number, height: number, frame: 'baseline' | 'progressive' = 'baseline') {
  const app0 = Buffer.from([
    0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00,
    0x00,
  ]);
  const dqt = Buffer.concat([Buffer.from([0xff, 0xdb, 0x00, 0x43, 0x00]), Buffer.alloc(64, 1)]);
  const sof = Buffer.from([
    0xff,
    0xff,
    0xff,
    frame === 'baseline' ? 0xc0 : 0xc2,
    0x00,
    0x11,
    8,
    height >> 8,
    height & 0xff,
    width >> 8,
    width & 0xff,
    3,
    1,
    0x22,
    0,
    2,
    0x11,
    1,
    3,
    0x11,
    1,
  ]);
  return Buffer.concat([Buffer.from([0xff, 0xd8]), app0, dqt, sof, Buffer.from([0xff, 0xd9])]);
}

/**
 * The header of a WebP of width × height in a RIFF container (RFC 9649): extended (VP8X, §2.7:
 * canvas width and height minus one, 24-bit little-endian), lossless (VP8L, §3.2.1: signature 0x2f,
 * then 14 bits width minus one, 14 bits height minus one) or lossy (VP8, RFC 6386 §9.1: frame tag,
 * start code 9d 01 2a, 14-bit width and height).
 */
export function webpHeaderOf(width: number, height: number, chunk: 'VP8X' | 'VP8L' | 'VP8 ' = 'VP8X') {
  const data = Buffer.alloc(10);
  if (chunk === 'VP8X') {
    data.writeUIntLE(width - 1, 4, 3);
    data.writeUIntLE(height - 1, 7, 3);
  } else if (chunk === 'VP8L') {
    data[0] = 0x2f;
    data.writeUInt32LE(((width - 1) | ((height - 1) << 14)) >>> 0, 1);
  } else {
    data.set([0x50, 0x01, 0x00, 0x9d, 0x01, 0x2a], 0); // key frame tag, start code
    data.writeUInt16LE(width, 6);
    data.writeUInt16LE(height, 8);
  }
  const head = Buffer.alloc(8);
  head.write(chunk, 0, 'ascii');
  head.writeUInt32LE(data.length, 4);
  const riff = Buffer.alloc(12);
  riff.write('RIFF', 0, 'ascii');
  riff.writeUInt32LE(4 + head.length + data.length, 4);
  riff.write('WEBP', 8, 'ascii');
  return Buffer.concat([riff, head, data]);
}
