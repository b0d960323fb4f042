/**
 * A photo taken on the phone, made small enough to carry out of the field: the longer side at most
 * 1600 px, JPEG. Phones take 3–12 MB pictures; these end up around 200–500 kB.
 */

/** Larger than this is refused before decoding (a phone camera stays well below it). */
export const PHOTO_INPUT_MAX_BYTES = 25 * 1024 * 1024;
/** The server's limit (server/routes/walks.ts PHOTO_MAX_BYTES). */
export const PHOTO_STORED_MAX_BYTES = 2 * 1024 * 1024;
const MAX_SIDE_PX = 1600;

export class PhotoError extends Error {}

const mb = (bytes: number) => `${(bytes / (1024 * 1024)).toFixed(1)} MB`;

/** Checks what can be checked without decoding; throws PhotoError with a message for the person holding the phone. */
export function checkPhotoFile(file: { name: string; size: number; type: string }): void {
  if (file.size > PHOTO_INPUT_MAX_BYTES) {
    throw new PhotoError(
      `The photo "${file.name}" is ${mb(file.size)}; photos up to ${mb(PHOTO_INPUT_MAX_BYTES)} can be taken in. Take it again at a lower resolution. The point itself is kept.`,
    );
  }
  if (file.type && !file.type.startsWith('image/')) throw new PhotoError(`"${file.name}" is not a picture. Choose a photo. The point itself is kept.`);
}

/** Decodes, scales and re-encodes as JPEG; throws PhotoError when it cannot. */
export async function compressPhoto(file: File): Promise<Blob> {
  checkPhotoFile(file);
  let bitmap: ImageBitmap;
  try {
    bitmap = await createImageBitmap(file);
  } catch {
    throw new PhotoError(`"${file.name}" could not be read as a picture. Choose a JPEG or PNG photo. The point itself is kept.`);
  }
  const scale = Math.min(1, MAX_SIDE_PX / Math.max(bitmap.width, bitmap.height));
  const canvas = new OffscreenCanvas(Math.max(1, Math.round(bitmap.width * scale)), Math.max(1, Math.round(bitmap.height * scale)));
  canvas.getContext('2d')!.drawImage(bitmap, 0, 0, canvas.width, canvas.height);
  bitmap.close();
  for (const quality of [0.8, 0.6, 0.4]) {
    const blob = await canvas.convertToBlob({ type: 'image/jpeg', quality });
    if (blob.size <= PHOTO_STORED_MAX_BYTES) return blob;
  }
  throw new PhotoError(
    `"${file.name}" stays larger than ${mb(PHOTO_STORED_MAX_BYTES)} even compressed. Take it again at a lower resolution. The point itself is kept.`,
  );
}
