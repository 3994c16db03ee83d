/** Longest side of a thumbnail, in pixels: sharp on a 160 px tile at twice the pixel density. */
const THUMB_SIZE = 320;

/**
 * A small WebP of a photo, drawn by the browser itself (no image library on the server). Null when
 * the browser cannot decode or encode it; the job page then shows the photo scaled down instead.
 */
export async function makeThumbnail(file: Blob): Promise<Blob | null> {
  try {
    if (typeof createImageBitmap !== 'function' || typeof document === 'undefined') return null;
    const bitmap = await createImageBitmap(file);
    const scale = Math.min(1, THUMB_SIZE / Math.max(bitmap.width, bitmap.height));
    const canvas = document.createElement('canvas');
    canvas.width = Math.max(1, Math.round(bitmap.width * scale));
    canvas.height = Math.max(1, Math.round(bitmap.height * scale));
    const context = canvas.getContext('2d');
    if (!context) return null;
    context.drawImage(bitmap, 0, 0, canvas.width, canvas.height);
    bitmap.close();
    const blob = await new Promise<Blob | null>((resolve) =>
      canvas.toBlob(resolve, 'image/webp', 0.8),
    );
    // A browser without a WebP encoder hands back PNG; anything else is not worth sending.
    return blob && (blob.type === 'image/webp' || blob.type === 'image/png') ? blob : null;
  } catch {
    return null;
  }
}
