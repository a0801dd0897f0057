/**
 * VTK XML ImageData (.vti) writer for general-purpose visualisation tools (VTK file formats,
 * "VTK XML formats", Kitware; open standard).
 *
 * Our choices, documented:
 * - one file holding every field as CellData (our fields are cell-centred): WholeExtent
 *   "0 nx 0 ny 0 nz" counts points, so there are nx*ny*nz cells; Origin is the box corner
 *   (-L/2, -L/2, -L/2) and Spacing the cell size, in the file's length unit;
 * - velocity and magnetic field as 3-component vectors, scalars as 1-component arrays;
 * - data appended as raw binary (<AppendedData encoding="raw">, byte_order="LittleEndian",
 *   header_type="UInt64"): after the "_" marker each array is an 8-byte byte count followed by
 *   its values; every DataArray's `offset` is the byte position of its count after the "_".
 *   Raw (not base64) keeps 512^3 files compact and fast; the XML part before the marker is plain text.
 * - VTK orders cells with x fastest: cell (i, j, k) is at i + nx*(j + ny*k), the transpose of
 *   our C order (i*ny + j)*nz + k; the writer transposes in slabs of z-planes.
 * Each DataArray carries an extra `units` attribute (ignored by VTK readers) naming its unit.
 */
import type { Grid3 } from '../grid/grid3.js';
import { cellSize } from '../grid/grid3.js';
import { openAtomicStream } from './atomic-file.js';
import { littleEndianBytes } from './npy.js';
import { floatArray, groupVectors, type GridField, type GridVector } from './grid-fields.js';
import type { UnitSystem } from './unit-system.js';
import type { WrittenFile } from './grid-stream.js';
import type { ProgressStage } from '../progress.js';

/** z-planes transposed at a time (bounded memory: slab * nx * ny * 3 values). */
const SLAB = 8;

function xmlEscape(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** The XML text before the appended payload, and the byte length of each array's data. */
export function vtiHeader(grid: Grid3, items: ReadonlyArray<GridField | GridVector>, precision: 'float32' | 'float64', units: UnitSystem, comment: string): { xml: string; sizes: number[] } {
  const { nx, ny, nz } = grid;
  const b = precision === 'float32' ? 4 : 8;
  const type = precision === 'float32' ? 'Float32' : 'Float64';
  const L = grid.boxSize * units.fromCgs.length;
  const dx = cellSize(grid) * units.fromCgs.length;
  const o = (-L / 2).toPrecision(17);
  const sizes: number[] = [];
  let offset = 0;
  const arrays: string[] = [];
  for (const it of items) {
    const comps = 'components' in it ? 3 : 1;
    const unit = 'components' in it ? it.components[0].unit : it.unit;
    const size = nx * ny * nz * comps * b;
    arrays.push(`        <DataArray type="${type}" Name="${it.name}" NumberOfComponents="${comps}" format="appended" offset="${offset}" units="${xmlEscape(unit)}"/>`);
    sizes.push(size);
    offset += 8 + size;
  }
  const scalars = items.find((i) => !('components' in i))?.name;
  const vectors = items.find((i) => 'components' in i)?.name;
  const attrs = `${scalars ? ` Scalars="${scalars}"` : ''}${vectors ? ` Vectors="${vectors}"` : ''}`;
  const xml = [
    '<?xml version="1.0"?>',
    `<!-- ${xmlEscape(comment).replace(/--/g, '- -')} -->`,
    '<VTKFile type="ImageData" version="1.0" byte_order="LittleEndian" header_type="UInt64">',
    `  <ImageData WholeExtent="0 ${nx} 0 ${ny} 0 ${nz}" Origin="${o} ${o} ${o}" Spacing="${dx.toPrecision(17)} ${dx.toPrecision(17)} ${dx.toPrecision(17)}">`,
    `    <Piece Extent="0 ${nx} 0 ${ny} 0 ${nz}">`,
    '      <PointData>',
    '      </PointData>',
    `      <CellData${attrs}>`,
    ...arrays,
    '      </CellData>',
    '    </Piece>',
    '  </ImageData>',
    '  <AppendedData encoding="raw">',
    '   _',
  ].join('\n');
  return { xml, sizes };
}

/** Writes all fields into one .vti file (appended raw binary), streaming slabs of z-planes. */
export async function writeVti(file: string, grid: Grid3, fields: readonly GridField[], precision: 'float32' | 'float64', units: UnitSystem, comment: string, force: boolean, stage?: ProgressStage): Promise<WrittenFile> {
  const { nx, ny, nz } = grid;
  const items = groupVectors(fields);
  const { xml, sizes } = vtiHeader(grid, items, precision, units, comment);
  const out = openAtomicStream(file, force);
  let bytes = 0;
  const put = async (u: Uint8Array): Promise<void> => { await out.write(u); bytes += u.length; };
  const slab = Math.min(SLAB, nz);
  const planeCells = nx * ny;
  const buf = floatArray(precision, slab * planeCells * 3);
  let done = 0;
  try {
    await put(new TextEncoder().encode(xml));
    for (let a = 0; a < items.length; a++) {
      const it = items[a]!;
      const comps = 'components' in it ? it.components : [it];
      const nc = comps.length;
      const count = new DataView(new ArrayBuffer(8));
      count.setBigUint64(0, BigInt(sizes[a]!), true);
      await put(new Uint8Array(count.buffer));
      for (let k0 = 0; k0 < nz; k0 += slab) {
        const kn = Math.min(slab, nz - k0);
        for (let c = 0; c < nc; c++) {
          const src = comps[c]!.source;
          const s = comps[c]!.scale;
          for (let i = 0; i < nx; i++) {
            for (let j = 0; j < ny; j++) {
              const base = (i * ny + j) * nz + k0;
              const cell = j * nx + i;
              for (let kk = 0; kk < kn; kk++) buf[(kk * planeCells + cell) * nc + c] = src[base + kk]! * s;
            }
          }
        }
        await put(littleEndianBytes(buf.subarray(0, kn * planeCells * nc)));
        done += kn;
        stage?.update(done);
      }
    }
    await put(new TextEncoder().encode('\n  </AppendedData>\n</VTKFile>\n'));
    const sha256 = await out.commit();
    return { sha256, bytes };
  } catch (e) {
    out.abort();
    throw e;
  }
}
