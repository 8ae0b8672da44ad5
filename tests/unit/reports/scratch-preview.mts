import { writeFileSync } from 'node:fs';
import { renderReportPdf } from '../../../src/lib/server/reports/pdf';
import { typicalReport, sparseComparison } from './helpers/comparison-factory';
const t0 = performance.now();
const a = await renderReportPdf(typicalReport());
const t1 = performance.now();
const times: number[] = [];
for (let i = 0; i < 10; i++) { const s = performance.now(); await renderReportPdf(typicalReport()); times.push(performance.now() - s); }
writeFileSync('/tmp/pdftry/typical.pdf', a);
const b = await renderReportPdf(typicalReport({ comparison: sparseComparison(), problemBands: [], plan: null, advice: '' }));
writeFileSync('/tmp/pdftry/sparse.pdf', b);
console.log('first', (t1 - t0).toFixed(1), 'ms; warm', times.map((t) => t.toFixed(1)).join(' '), 'bytes', a.length);
const problemBands = Array.from({ length: 40 }, (_, i) => ({ id: i, fLoHz: 40 * 1.1 ** i, fHiHz: 40 * 1.1 ** i * 1.08, tLoMs: null, tHiMs: null, severity: 'moderate' as const, note: `Note ${i + 1}: a longer remark that wraps onto a second line of the note column so rows differ in height.`, status: 'open' as const }));
writeFileSync('/tmp/pdftry/long.pdf', await renderReportPdf(typicalReport({ problemBands })));
