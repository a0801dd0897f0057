/**
 * Source: the VTK file-format specification (Kitware), read with Python xml.etree and numpy.
 * Outside check: the .vti file follows the VTK XML ImageData format (VTK file formats, "VTK XML
 * formats", Kitware): Python's xml.etree parses its XML part, WholeExtent/Origin/Spacing say the
 * declared grid, and numpy decodes the appended raw payload (UInt64 byte count, then the values,
 * x fastest) to the values numpy reads from our .npy files of the same export.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pythonJson } from '../helpers/python.js';
import { fixtureCloud } from '../helpers/export-cloud.js';
import { writeGridExports } from '../../src/export/grid-exports.js';

const META = { toolVersion: '0.1.0', seed: 3, configText: 'seed: 3\n', configSha256: 'd'.repeat(64), name: 'vti-test' };

const READ = `
import sys, json, hashlib, numpy as np
import xml.etree.ElementTree as ET
a = json.load(sys.stdin)
raw = open(a['dir'] + '/cloud.vti', 'rb').read()
tag = b'<AppendedData encoding="raw">'
head_end = raw.index(tag) + len(tag)
marker = raw.index(b'_', head_end)
xml = raw[:head_end] + b'</AppendedData></VTKFile>'
root = ET.fromstring(xml)
img = root.find('ImageData')
payload = raw[marker + 1:]
nx, ny, nz = [int(v) for v in img.get('WholeExtent').split()[1::2]]
dt = np.dtype('<f4') if root.find('.//DataArray').get('type') == 'Float32' else np.dtype('<f8')
arrays = {}
max_diff = {}
for da in root.iter('DataArray'):
    off = int(da.get('offset')); nc = int(da.get('NumberOfComponents'))
    nbytes = int(np.frombuffer(payload[off:off + 8], dtype='<u8')[0])
    vals = np.frombuffer(payload[off + 8:off + 8 + nbytes], dtype=dt).reshape(nz, ny, nx, nc)
    c_order = vals.transpose(2, 1, 0, 3)  # VTK x fastest -> (nx, ny, nz, nc)
    name = da.get('Name')
    comps = [name] if nc == 1 else [name + '_' + s for s in 'xyz']
    for i, cname in enumerate(comps):
        ref = np.load(a['dir'] + '/' + cname + '.npy')
        max_diff[cname] = float(np.abs(c_order[..., i] - ref).max())
    arrays[name] = {'nc': nc, 'nbytes': nbytes, 'units': da.get('units')}
tail = payload[-40:].decode('latin1')
print(json.dumps({'type': root.get('type'), 'byte_order': root.get('byte_order'), 'header_type': root.get('header_type'),
  'extent': img.get('WholeExtent'), 'origin': [float(v) for v in img.get('Origin').split()],
  'spacing': [float(v) for v in img.get('Spacing').split()], 'arrays': arrays, 'max_diff': max_diff,
  'ends_ok': tail.rstrip().endswith('</VTKFile>'), 'sha256': hashlib.sha256(raw).hexdigest()}))
`;

describe('the .vti file is VTK XML ImageData', () => {
  let dir: string;
  beforeAll(() => { dir = mkdtempSync(path.join(tmpdir(), 'fragplan-vti-')); return () => rmSync(dir, { recursive: true, force: true }); });

  it('parses as XML with the declared extent, origin and spacing, and its payload decodes to our values', async () => {
    const n = 12; // not a multiple of the writer's z-slab, to exercise the last partial slab
    const cloud = fixtureCloud({ n });
    const m = await writeGridExports(cloud, dir, { formats: ['npy', 'vti'], precision: 'float32', units: 'cgs', thermalField: 'temperature', force: false }, META);
    const r = pythonJson<{
      type: string; byte_order: string; header_type: string; extent: string; origin: number[]; spacing: number[];
      arrays: Record<string, { nc: number; nbytes: number; units: string }>; max_diff: Record<string, number>; ends_ok: boolean; sha256: string;
    }>(READ, JSON.stringify({ dir }));
    expect(r.type).toBe('ImageData');
    expect(r.byte_order).toBe('LittleEndian');
    expect(r.header_type).toBe('UInt64');
    expect(r.extent).toBe(`0 ${n} 0 ${n} 0 ${n}`);
    const L = cloud.grid.boxSize;
    for (let a = 0; a < 3; a++) {
      expect(Math.abs(r.origin[a]! / (-L / 2) - 1)).toBeLessThan(1e-15);
      expect(Math.abs(r.spacing[a]! / (L / n) - 1)).toBeLessThan(1e-15);
    }
    expect(r.arrays.velocity!.nc).toBe(3);
    expect(r.arrays.magnetic!.nc).toBe(3);
    expect(r.arrays.density!.nbytes).toBe(n ** 3 * 4);
    expect(r.arrays.density!.units).toBe('g cm^-3');
    expect(Object.keys(r.max_diff).sort()).toEqual(['density', 'magnetic_x', 'magnetic_y', 'magnetic_z', 'temperature', 'velocity_x', 'velocity_y', 'velocity_z']);
    for (const v of Object.values(r.max_diff)) expect(v).toBe(0);
    expect(r.ends_ok).toBe(true);
    expect(r.sha256).toBe(m.files['cloud.vti']!.sha256);
  });
});
