// Width and height read from an image's header, never by decoding its pixels, so an image too large
// to handle is refused before anything reads it. Every read is bounds-checked; a header that cannot
// be read gives null.

export interface ImageSize {
  width: number;
  height: number;
}

export function imageSize(bytes: Buffer, mediaType: string): ImageSize | null {
  if (mediaType === 'image/png') return pngSize(bytes);
  if (mediaType === 'image/jpeg') return jpegSize(bytes);
  if (mediaType === 'image/webp') return webpSize(bytes);
  return null;
}

const ascii = (b: Buffer, from: number, to: number) => b.toString('latin1', from, to);

/** PNG (ISO/IEC 15948 §5.2, §11.2.2): after the 8-byte signature, IHDR with 4-byte big-endian width and height. */
function pngSize(b: Buffer): ImageSize | null {
  if (b.length < 24 || ascii(b, 12, 16) !== 'IHDR') return null;
  return { width: b.readUInt32BE(16), height: b.readUInt32BE(20) };
}

/** JPEG (ITU-T T.81 §B.1.1.2, §B.2.2): marker segments up to the first frame header SOFn, which holds Y and X. */
function jpegSize(b: Buffer): ImageSize | null {
  let i = 2; // after SOI
  while (i + 4 <= b.length) {
    if (b[i] !== 0xff) return null;
    const marker = b[i + 1]!;
    if (marker === 0xff) {
      i += 1; // fill byte
      continue;
    }
    if (marker === 0x01 || (marker >= 0xd0 && marker <= 0xd8)) {
      i += 2; // markers without a length (TEM, RSTn, SOI)
      continue;
    }
    if (marker === 0xd9 || marker === 0xda) return null; // end of image or scan data before any frame header
    const length = b.readUInt16BE(i + 2);
    if (length < 2) return null;
    // SOF0–SOF15, except DHT (C4), JPG (C8) and DAC (CC), which share the range.
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      if (i + 9 > b.length) return null;
      const height = b.readUInt16BE(i + 5);
      const width = b.readUInt16BE(i + 7);
      // A height of 0 is defined later by a DNL segment; such files are not accepted.
      return width && height ? { width, height } : null;
    }
    i += 2 + length;
  }
  return null;
}

/** WebP (RFC 9649 §2.5–2.7): the first chunk after "RIFF....WEBP" is VP8X, VP8L or VP8. */
function webpSize(b: Buffer): ImageSize | null {
  if (b.length < 30 || ascii(b, 0, 4) !== 'RIFF' || ascii(b, 8, 12) !== 'WEBP') return null;
  const chunk = ascii(b, 12, 16);
  // Extended: canvas width and height minus one, 24-bit little-endian, after flags and 3 reserved bytes.
  if (chunk === 'VP8X') return { width: b.readUIntLE(24, 3) + 1, height: b.readUIntLE(27, 3) + 1 };
  // Lossless: signature 0x2f, then 14 bits width minus one and 14 bits height minus one.
  if (chunk === 'VP8L') {
    if (b[20] !== 0x2f) return null;
    const bits = b.readUInt32LE(21);
    return { width: (bits & 0x3fff) + 1, height: ((bits >>> 14) & 0x3fff) + 1 };
  }
  // Lossy (RFC 6386 §9.1): 3-byte frame tag, start code 9d 01 2a, then 14-bit width and height.
  if (chunk === 'VP8 ') {
    if (b[23] !== 0x9d || b[24] !== 0x01 || b[25] !== 0x2a) return null;
    return { width: b.readUInt16LE(26) & 0x3fff, height: b.readUInt16LE(28) & 0x3fff };
  }
  return null;
}
