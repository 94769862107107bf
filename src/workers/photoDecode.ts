/** Returns RGBA bytes of a photo decoded by the browser (createImageBitmap works in workers; PNG, JPEG, WebP). */
export async function photoDecode(blob: Blob): Promise<{ width: number; height: number; rgba: Uint8Array }> {
  const bitmap = await createImageBitmap(blob, { colorSpaceConversion: 'none', premultiplyAlpha: 'none' });
  const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
  const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
  ctx.drawImage(bitmap, 0, 0);
  bitmap.close();
  const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
  return { width: canvas.width, height: canvas.height, rgba: new Uint8Array(data.buffer, data.byteOffset, data.byteLength) };
}
