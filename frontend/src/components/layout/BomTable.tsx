import type { BomLine } from '@shared/analysis';
import { bomCsv } from '@shared/analysis';
import { exportNotes } from '@shared/safety';
import { layoutStateWords } from '@shared/words';
import { saveBlob } from '../../api/planSheets';
import { Button } from '../Button';

/** The bill of materials of fences (item, size, quantity) with its totals and a CSV download. */
export function BomTable({ bom, lengthMm, areaM2, fileName, label, layoutName }: { bom: ReadonlyArray<BomLine>; lengthMm: number; areaM2?: number | null; fileName: string; label: string; layoutName: string }) {
  return (
    <div className="flex flex-col gap-2" data-bom={label}>
      <table aria-label={label} className="w-full border-collapse text-xs">
        <thead>
          <tr className="border-b border-rule text-left text-ink-muted">
            <th className="py-1 pr-2 font-bold">Item</th>
            <th className="py-1 pr-2 font-bold">Size</th>
            <th className="py-1 text-right font-bold">Qty</th>
          </tr>
        </thead>
        <tbody>
          {bom.map((b) => (
            <tr key={`${b.item}|${b.size}`} className="border-b border-rule/60">
              <td className="py-0.5 pr-2">{b.item}</td>
              <td className="py-0.5 pr-2 tabular-nums">{b.size}</td>
              <td className="py-0.5 text-right tabular-nums">{b.quantity}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="text-xs text-ink-muted" data-bom-totals>
        Fence length {(lengthMm / 1000).toFixed(2)} m{areaM2 != null ? ` · enclosed floor ${areaM2.toFixed(1)} m²` : ''}
      </p>
      <div>
        <Button size="sm" disabled={!bom.length} onClick={() => saveBlob(new Blob(['\uFEFF', bomCsv(bom, exportNotes({ what: label.toLowerCase(), layoutName, state: layoutStateWords(null), at: new Date() }))], { type: 'text/csv;charset=utf-8' }), fileName)}>
          Download CSV
        </Button>
      </div>
    </div>
  );
}
