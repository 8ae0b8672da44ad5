import PDFDocument from 'pdfkit';
import { registerReportFonts } from '../../../src/lib/server/reports/fonts';
import { ReportPen } from '../../../src/lib/server/reports/pen';
import { drawReport } from '../../../src/lib/server/reports/sections';
import { typicalReport } from './helpers/comparison-factory';
for (let i = 0; i < 6; i++) {
  const t0 = performance.now();
  const doc = new PDFDocument({ size: 'A4', bufferPages: true });
  const chunks: Buffer[] = []; doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise((r) => doc.on('end', r));
  const fonts = registerReportFonts(doc);
  const t1 = performance.now();
  const r = typicalReport();
  drawReport(new ReportPen(doc, fonts), { ...r, plan: r.plan ?? null, targetBasis: 'x' });
  const t2 = performance.now();
  doc.end(); await done;
  const t3 = performance.now();
  console.log('fonts', (t1-t0).toFixed(1), 'draw', (t2-t1).toFixed(1), 'end', (t3-t2).toFixed(1));
}
