import { fileTypeFromBuffer } from 'file-type/core';
import sharp from 'sharp';
import { REPORT_LIMITS } from '@loamline/shared-types';

export type PhotoType = (typeof REPORT_LIMITS.photoTypes)[number];
const EXT: Record<PhotoType, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' };

/** A photo refused for what it is (the message says why, in the technician's terms). */
export class PhotoError extends Error {
  override readonly name = 'PhotoError';
}

/** Largest picture decoded for a thumbnail (a 50-megapixel camera; refuses decompression bombs). */
const MAX_PIXELS = 50_000_000;

export interface CheckedPhoto {
  contentType: PhotoType;
  ext: string;
  /** the picture as stored: upright and re-encoded without its metadata (camera, time, GPS position) */
  clean: Buffer;
  thumbnail: Buffer;
}

/**
 * Checks an uploaded photo by its content (the name and the browser's type are not trusted):
 * JPEG, PNG or WebP by its magic bytes (file-type's core: buffers only, no Node streams), then decoded for a JPEG thumbnail at most
 * 320 px on its longer side (sharp), which also refuses a file that only starts like an image.
 */
export async function checkPhoto(bytes: Buffer): Promise<CheckedPhoto> {
  const found = await fileTypeFromBuffer(bytes);
  const type = found?.mime as PhotoType | undefined;
  if (!type || !(REPORT_LIMITS.photoTypes as readonly string[]).includes(type))
    throw new PhotoError(
      `this file is not a JPEG, PNG or WebP picture (its content ${found ? `is ${found.mime}` : 'is not a known picture format'}, whatever its name says)`,
    );
  let thumbnail: Buffer;
  let clean: Buffer;
  try {
    // sharp writes no metadata unless asked: a phone's EXIF GPS position (often the rider's home) goes
    const upright = sharp(bytes, { limitInputPixels: MAX_PIXELS, failOn: 'error' }).rotate();
    clean = await (
      type === 'image/png'
        ? upright.png()
        : type === 'image/webp'
          ? upright.webp({ quality: 90 })
          : upright.jpeg({ quality: 90 })
    ).toBuffer();
    thumbnail = await sharp(bytes, { limitInputPixels: MAX_PIXELS, failOn: 'error' })
      .rotate() // upright, as the camera meant it
      .resize(REPORT_LIMITS.thumbnailPx, REPORT_LIMITS.thumbnailPx, {
        fit: 'inside',
        withoutEnlargement: true,
      })
      .jpeg({ quality: 80 })
      .toBuffer();
  } catch {
    throw new PhotoError('this picture could not be read (damaged, or larger than 50 megapixels)');
  }
  return { contentType: type, ext: EXT[type], clean, thumbnail };
}
