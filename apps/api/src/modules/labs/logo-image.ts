import { LAB_LOGO_MAX_BYTES } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';

export interface LogoImage {
  contentType: 'image/png' | 'image/jpeg';
  widthPx: number;
  heightPx: number;
}

/** Largest side accepted, in pixels: a header logo needs far less, and pdfkit decodes PNGs in memory. */
export const LOGO_MAX_SIDE_PX = 4000;

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function pngSize(bytes: Buffer): { widthPx: number; heightPx: number } | null {
  // signature, then the IHDR chunk first: length 13, type, width, height (PNG spec, section 11.2.2)
  if (bytes.length < 33 || bytes.readUInt32BE(8) !== 13 || bytes.toString('latin1', 12, 16) !== 'IHDR') return null;
  return { widthPx: bytes.readUInt32BE(16), heightPx: bytes.readUInt32BE(20) };
}

function jpegSize(bytes: Buffer): { widthPx: number; heightPx: number } | null {
  // Walk the marker segments to the first start-of-frame (SOF0–SOF15 except DHT C4, JPG C8, DAC CC).
  let at = 2;
  while (at + 9 < bytes.length) {
    if (bytes[at] !== 0xff) return null;
    const marker = bytes[at + 1];
    if (marker === 0xff) {
      at += 1;
      continue;
    }
    const length = bytes.readUInt16BE(at + 2);
    if (length < 2) return null;
    if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
      return { heightPx: bytes.readUInt16BE(at + 5), widthPx: bytes.readUInt16BE(at + 7) };
    }
    if (marker === 0xda || marker === 0xd9) return null; // scan data or end before any frame header
    at += 2 + length;
  }
  return null;
}

/**
 * Checks an uploaded logo by its bytes, never its name: a PNG or JPEG whose header gives a size.
 * Anything else is refused with the reason, naming the field.
 */
export function readLogo(bytes: Buffer, fileName: string): LogoImage {
  const refuse = (why: string): never => {
    throw ApiError.badRequest(`${fileName}: ${why} Nothing was changed.`, [{ field: 'logo', message: why }]);
  };
  if (bytes.length > LAB_LOGO_MAX_BYTES) refuse(`is larger than ${LAB_LOGO_MAX_BYTES / 1024} KB.`);
  let contentType: LogoImage['contentType'];
  let size: { widthPx: number; heightPx: number } | null;
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(PNG_SIGNATURE)) {
    contentType = 'image/png';
    size = pngSize(bytes);
  } else if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) {
    contentType = 'image/jpeg';
    size = jpegSize(bytes);
  } else {
    return refuse('is not a PNG or JPEG image (checked by its content, not its name).');
  }
  if (!size || size.widthPx < 1 || size.heightPx < 1) return refuse(`is a damaged ${contentType === 'image/png' ? 'PNG' : 'JPEG'} image (no readable size).`);
  if (size.widthPx > LOGO_MAX_SIDE_PX || size.heightPx > LOGO_MAX_SIDE_PX) {
    return refuse(`is ${size.widthPx} × ${size.heightPx} pixels; the largest side may be at most ${LOGO_MAX_SIDE_PX} pixels.`);
  }
  return { contentType, ...size };
}
