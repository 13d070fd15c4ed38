import { describe, expect, it } from 'vitest';
import { DxfImportError } from '../../../backend/src/services/dxf/errors';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { parseInWorker } from '../../../backend/src/services/dxf/parseInWorker';
import { DxfWriter } from '../../../samples/make-samples';
import { readSample } from './support';

describe('import in a worker thread', () => {
  it('reads a sample in a real worker and gives the same result as in-process', async () => {
    const text = readSample('fernhill-hall.dxf');
    const viaWorker = await parseInWorker(text);
    expect(viaWorker).toEqual(importDxf(text));
    expect(viaWorker.layers.map((l) => l.name)).toContain('OUTLINE');
  }, 30_000);

  it('accepts bytes (as an upload arrives) and options', async () => {
    const bytes = new TextEncoder().encode(readSample('fernhill-hall-r12.dxf'));
    const r = await parseInWorker(bytes, { units: 'cm' });
    expect(r.units).toBe('cm');
    expect(r.unitsSource).toBe('chosen');
    expect(r.bounds.maxX).toBe(240000);
  }, 30_000);

  it('a garbage file comes back as DxfImportError with the same code, message and line as in-process', async () => {
    const cases = [
      'this is not a drawing at all\n',
      readSample('fernhill-hall.dxf').split('\n').slice(0, 300).join('\n'),
      '',
    ];
    for (const text of cases) {
      let local: DxfImportError | undefined;
      try {
        importDxf(text);
      } catch (e) {
        local = e as DxfImportError;
      }
      expect(local).toBeInstanceOf(DxfImportError);
      const remote = await parseInWorker(text).then(
        () => undefined,
        (e: unknown) => e,
      );
      expect(remote).toBeInstanceOf(DxfImportError);
      expect((remote as DxfImportError).toJSON()).toEqual(local!.toJSON());
    }
  }, 60_000);

  it('stops a job that runs past its time with a timeout error', async () => {
    const err = await parseInWorker(readSample('fernhill-hall.dxf'), {}, { timeoutMs: 1 }).then(
      () => undefined,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(DxfImportError);
    expect((err as DxfImportError).code).toBe('timeout');
  }, 30_000);

  it('a worker that runs out of memory ends in a clean error, and the caller goes on', async () => {
    const w = new DxfWriter().insunits(4).layer('A', 1);
    for (let i = 0; i < 60000; i++) w.line('A', [i, 0], [i, 1000]);
    const err = await parseInWorker(w.toString(), {}, { maxHeapMb: 16 }).then(
      () => undefined,
      (e: unknown) => e,
    );
    expect(err).toBeInstanceOf(DxfImportError);
    expect((err as DxfImportError).code).toBe('internal');
    expect((err as DxfImportError).message).toMatch(/more memory/);
    // the next job in a fresh worker works
    expect((await parseInWorker(readSample('fernhill-hall.dxf'))).stats.entities).toBe(23);
  }, 60_000);

  it('passes invalid options back as the caller’s RangeError', async () => {
    await expect(parseInWorker(readSample('fernhill-hall.dxf'), { chordToleranceMm: -1 })).rejects.toThrow(RangeError);
  }, 30_000);
});
