/**
 * The ZIP writer against outside references: Python's zipfile module reads the archive, checks
 * every entry's CRC (testzip) and returns the bytes; zlib.crc32 gives the CRC-32 of ISO 3309 /
 * ITU-T V.42 (the one PKWARE's APPNOTE names). Also read back by JSZip, which the viewer uses.
 */
import { beforeAll, describe, it, expect } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import JSZip from 'jszip';
import { crc32, zipArchive } from '../src/export/zip-writer.js';
import { pythonJson } from './helpers/python.js';

describe('zip writer', () => {
  const noise = new Uint8Array(5000);
  let s = 3;
  for (let i = 0; i < noise.length; i++) { s = (Math.imul(s, 1103515245) + 12345) >>> 0; noise[i] = s >>> 24; }
  const entries = [
    { name: 'a.json', data: '{"x": 1}\n'.repeat(200) },
    { name: 'noise.bin', data: noise }, // incompressible: stored
    { name: 'empty.txt', data: '' },
    { name: 'dir/ünïcode.csv', data: 'a,b\n1,2\n' },
  ];
  let bytes: Uint8Array;
  beforeAll(async () => { bytes = await zipArchive(entries, new Date(Date.UTC(1980, 0, 1))); });

  it('CRC-32 matches zlib.crc32 (common practice check value: "123456789" -> cbf43926)', () => {
    const text = Buffer.from('123456789');
    expect(crc32(text)).toBe(0xcbf43926);
    const want = pythonJson<number[]>('import sys,zlib,json; d=bytes.fromhex(sys.stdin.read()); print(json.dumps([zlib.crc32(d[:k]) for k in (0, 1, 777, len(d))]))', Buffer.from(noise).toString('hex'));
    expect([0, 1, 777, noise.length].map((k) => crc32(noise.subarray(0, k)))).toEqual(want);
  });

  it('Python zipfile reads every entry with a good CRC and the same bytes', () => {
    const file = path.join(mkdtempSync(path.join(tmpdir(), 'fragplan-zip-')), 'x.zip');
    writeFileSync(file, bytes);
    const got = pythonJson<{ bad: string | null; names: string[]; sha: string[]; methods: number[]; dates: number[][] }>(
      `import zipfile,hashlib,json
z = zipfile.ZipFile(${JSON.stringify(file)})
print(json.dumps({"bad": z.testzip(), "names": z.namelist(), "sha": [hashlib.sha256(z.read(n)).hexdigest() for n in z.namelist()],
  "methods": [i.compress_type for i in z.infolist()], "dates": [list(i.date_time) for i in z.infolist()]}))`);
    expect(got.bad).toBeNull();
    expect(got.names).toEqual(entries.map((e) => e.name));
    const { createHash } = require('node:crypto') as typeof import('node:crypto');
    expect(got.sha).toEqual(entries.map((e) => createHash('sha256').update(e.data).digest('hex')));
    expect(got.methods).toEqual([8, 0, 0, 0]); // deflated unless that does not shrink it (noise, empty, 8 bytes)
    expect(got.dates[0]).toEqual([1980, 1, 1, 0, 0, 0]);
  });

  it('JSZip (the viewer) reads it back; the same entries give the same bytes', async () => {
    const z = await JSZip.loadAsync(bytes);
    expect(await z.file('a.json')!.async('string')).toBe(entries[0]!.data);
    expect(Buffer.compare(Buffer.from(await z.file('noise.bin')!.async('uint8array')), Buffer.from(noise))).toBe(0);
    expect(Buffer.compare(Buffer.from(await zipArchive(entries, new Date(Date.UTC(1980, 0, 1)))), Buffer.from(bytes))).toBe(0);
  });
});
