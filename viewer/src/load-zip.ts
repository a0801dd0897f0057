/** Opening a preview.zip (bytes) with jszip and decoding it (top-level entries only). */
import JSZip from 'jszip';
import { decodePreview, type PreviewData } from './preview-data.js';

/** Unzips the bundle and decodes it; throws an Error with a readable message on a bad bundle. */
export async function openPreview(bytes: ArrayBuffer | Uint8Array): Promise<PreviewData> {
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(bytes);
  } catch {
    throw new Error('this file is not a zip archive (expected the preview.zip that `fragplan plan` writes)');
  }
  const text = new Map<string, string>();
  const bin = new Map<string, Uint8Array>();
  for (const name of Object.keys(zip.files)) {
    const f = zip.files[name];
    if (f.dir || name.includes('/') || name.includes('\\')) continue; // the layout has top-level entries only
    if (/\.(json|csv)$/.test(name)) text.set(name, await f.async('string'));
    else bin.set(name, await f.async('uint8array'));
  }
  return decodePreview({ text: (n) => text.get(n) ?? null, bytes: (n) => bin.get(n) ?? null });
}
