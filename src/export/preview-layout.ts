/**
 * Layout of preview.zip, the bundle the viewer loads (schema "fragplan.preview/1").
 *
 * Entries (all at the top level of the zip):
 * - preview.json   PreviewManifest below;
 * - density.f32    float32 little-endian, shape (n, n, n), C order, index (i*n + j)*n + k, i along x,
 *                  cell-centred, box [-L/2, L/2)^3: block-mean density (mass-conserving), g cm^-3;
 * - jeans.f32      float32, same shape: block-maximum Jeans number J = dx/lambda_J of the full grid
 *                  (the maximum, so no unresolved cell is hidden by averaging);
 * - labels.i32     int32, same shape: id of the deepest tree node holding the block's densest cell, -1 none;
 * - particles.f32  optional float32 x, y, z triples in pc (a subsample of at most 100 000);
 * - summary.json, tree.json, fragments.csv, plots.json (see src/report/plot-data.ts).
 */

/** A field entry of the preview. */
export interface PreviewField {
  file: string;
  dtype: 'float32' | 'int32';
  unit: string;
  min: number;
  max: number;
}

/** preview.json */
export interface PreviewManifest {
  schema: 'fragplan.preview/1';
  /** Preview cells per side. */
  cells: number;
  /** Cells per side of the full grid it was made from. */
  source_cells: number;
  box_size_pc: number;
  axis_order: 'C order (i*n + j)*n + k, i along x';
  fields: { density: PreviewField; jeans: PreviewField; labels: PreviewField };
  particles: { file: string; count: number; unit: 'pc' } | null;
  tool_version: string;
  seed: number | null;
}
