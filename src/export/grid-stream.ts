/**
 * Streams one gridded field to a .npy (NumPy format 1.0) or headerless little-endian .raw file,
 * plane by plane (fixed i, ny*nz values), through a temporary name renamed on completion.
 *
 * Grid conventions (src/grid/grid3.ts): shape (nx, ny, nz), C order, index (i*ny + j)*nz + k,
 * i along x, cell-centred, box [-L/2, L/2)^3. Memory: one plane buffer, never a second full copy; a
 * float32 field that needs no conversion is written straight from its source array.
 */
import type { Grid3 } from '../grid/grid3.js';
import { openAtomicStream } from './atomic-file.js';
import { littleEndianBytes, npyHeader } from './npy.js';
import { fillPlane, floatArray, type GridField } from './grid-fields.js';
import type { ProgressStage } from '../progress.js';

/** What was written: sha256 (hex) and size in bytes. */
export interface WrittenFile {
  sha256: string;
  bytes: number;
}

/** Writes one field as .npy (header) or .raw (no header), plane by plane; returns its sha256 and size. */
export async function writeFieldStream(
  file: string,
  field: GridField,
  grid: Grid3,
  precision: 'float32' | 'float64',
  withNpyHeader: boolean,
  force: boolean,
  stage?: ProgressStage,
): Promise<WrittenFile> {
  const { nx, ny, nz } = grid;
  const plane = ny * nz;
  const out = openAtomicStream(file, force);
  const buf = floatArray(precision, plane);
  let bytes = 0;
  try {
    if (withNpyHeader) {
      const h = npyHeader(precision, [nx, ny, nz]);
      await out.write(h);
      bytes += h.length;
    }
    if (field.scale === 1 && precision === 'float32') {
      // the file holds the source values as they are: write views of the (final) source, ~4 MB at a time
      const step = Math.max(1, Math.floor((4 << 20) / (4 * plane)));
      for (let i = 0; i < nx; i += step) {
        const j = Math.min(nx, i + step);
        const view = field.source.subarray(i * plane, j * plane);
        await out.write(littleEndianBytes(view), true);
        bytes += view.byteLength;
        stage?.update(j);
      }
    } else {
      for (let i = 0; i < nx; i++) {
        fillPlane(field, i, plane, buf);
        await out.write(littleEndianBytes(buf));
        bytes += buf.byteLength;
        stage?.update(i + 1);
      }
    }
    const sha256 = await out.commit();
    return { sha256, bytes };
  } catch (e) {
    out.abort();
    throw e;
  }
}
