import { createRequire } from 'node:module';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import sharp from 'sharp';
import { orderStatusLabels, readingExpectedText, readingMeasuredText, readingPointText, readingStateText, suspectText, type OrderStatus, type ReadingSetView } from '../../shared/api/orders';

const require = createRequire(import.meta.url);
const fontDir = path.join(path.dirname(require.resolve('@fontsource/roboto-condensed/package.json')), 'files');
export const FONT_REGULAR = path.join(fontDir, 'roboto-condensed-latin-400-normal.woff');
export const FONT_BOLD = path.join(fontDir, 'roboto-condensed-latin-700-normal.woff');

export interface ReportInput {
  shopName: string;
  number: number;
  status: OrderStatus;
  openedAt: Date;
  customer: { name: string; company: string | null };
  units: { modelName: string | null; serialNumber: string; hourMeter: number | null }[];
  complaint: string;
  cause: string | null;
  correction: string | null;
  customerNotes: string | null;
  tech: string | null;
  procedures: { title: string; steps: { text: string; doneBy: string | null; doneAt: Date | null }[] }[];
  drawings: { title: string; harnessName: string; revisionNumber: number | null; notes: string | null; markers: { kind: string; text: string; target: string | null }[]; png: Buffer }[];
  photos: { caption: string | null; filename: string; data: Buffer }[];
  readingSets: ReadingSetView[];
  cautions: { title: string; text: string }[];
  generatedAt: Date;
}

const INK = '#1b1c1e';
const MUTED = '#4f5257';
const RULE = '#b9b5ac';
const BAD = '#8a1712';
const OK = '#125226';
const CAUTION = '#6b4500';

const day = (d: Date) => d.toISOString().slice(0, 10);
const stamp = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

function fmtNumber(v: unknown): string {
  return typeof v === 'number' && Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : String(v ?? '—');
}

/** Photos as JPEG no wider than 1400 px (pdfkit reads JPEG and PNG only). */
async function forPdf(data: Buffer): Promise<Buffer> {
  return sharp(data).rotate().resize(1400, 1400, { fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 82 }).toBuffer();
}

/** The customer's report: the three Cs, marked-up drawings, chosen photos, readings, cautions. */
export async function buildReportPdf(input: ReportInput): Promise<Buffer> {
  const photos = await Promise.all(input.photos.map(async (p) => ({ ...p, jpeg: await forPdf(p.data) })));
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: 50, bottom: 60, left: 50, right: 50 },
    bufferPages: true,
    info: { Title: `Repair order ${input.number} — ${input.shopName}`, Author: input.shopName, Subject: 'Repair report', CreationDate: input.generatedAt },
    lang: 'en',
  });
  doc.registerFont('body', FONT_REGULAR);
  doc.registerFont('bold', FONT_BOLD);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;
  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const ensure = (h: number) => {
    if (doc.y + h > bottom()) doc.addPage();
  };
  /** A heading, kept with at least `follow` points of what comes under it. */
  const heading = (text: string, follow = 40) => {
    ensure(30 + follow);
    doc.moveDown(0.8);
    doc.font('bold').fontSize(14).fillColor(INK).text(text, left, doc.y, { width });
    doc.moveTo(left, doc.y + 2).lineTo(left + width, doc.y + 2).lineWidth(0.6).strokeColor(RULE).stroke();
    doc.moveDown(0.4);
  };
  const para = (text: string | null, empty = 'Not recorded.') => {
    doc.font('body').fontSize(11).fillColor(text ? INK : MUTED).text(text ?? empty, left, doc.y, { width, lineGap: 2 });
  };

  // Header
  doc.font('bold').fontSize(20).fillColor(INK).text(input.shopName, left, doc.y, { width });
  doc.font('body').fontSize(12).fillColor(MUTED).text(`Repair order ${input.number} · ${orderStatusLabels[input.status]} · opened ${day(input.openedAt)} · report of ${day(input.generatedAt)}`);
  doc.moveDown(0.6);
  doc.font('bold').fontSize(11).fillColor(INK).text('Customer: ', { continued: true }).font('body').text(`${input.customer.name}${input.customer.company ? `, ${input.customer.company}` : ''}`);
  for (const u of input.units) {
    doc.font('bold').text('Unit: ', { continued: true }).font('body').text(`${u.modelName ?? 'Unit'} · serial ${u.serialNumber}${u.hourMeter !== null ? ` · ${fmtNumber(u.hourMeter)} h` : ''}`);
  }
  if (input.tech) doc.font('bold').text('Technician: ', { continued: true }).font('body').text(input.tech);

  heading('Complaint');
  para(input.complaint);
  heading('Cause');
  para(input.cause, 'Diagnosis is not finished yet.');
  heading('Correction');
  para(input.correction, 'No repair recorded yet.');
  if (input.customerNotes) {
    heading('Notes from the shop');
    para(input.customerNotes);
  }

  if (input.procedures.length) {
    heading('Procedures carried out');
    for (const p of input.procedures) {
      ensure(40);
      doc.font('bold').fontSize(11).fillColor(INK).text(p.title, left, doc.y, { width });
      p.steps.forEach((s, i) => {
        ensure(18);
        const mark = s.doneAt ? 'DONE' : 'OPEN';
        doc.font('bold').fontSize(10).fillColor(s.doneAt ? OK : BAD).text(`${mark}  `, left + 8, doc.y, { continued: true, width: width - 8 });
        doc.font('body').fillColor(INK).text(`${i + 1}. ${s.text}${s.doneAt ? ` — ${s.doneBy ?? 'someone'}, ${stamp(s.doneAt)}` : ''}`);
      });
      doc.moveDown(0.3);
    }
  }

  for (const d of input.drawings) {
    heading(`Drawing: ${d.title}`, 200);
    doc.font('body').fontSize(10).fillColor(MUTED).text(`${d.harnessName}${d.revisionNumber !== null ? `, revision ${d.revisionNumber}` : ''}. Walked path in bold; numbered markers below.`, { width });
    doc.moveDown(0.3);
    const img = await sharp(d.png).metadata();
    const w = width;
    const h = Math.min(((img.height ?? 1) / (img.width ?? 1)) * w, bottom() - 100);
    ensure(h + 10);
    doc.image(d.png, left, doc.y, { fit: [w, h] });
    doc.y += h + 6;
    d.markers.forEach((m, i) => {
      ensure(16);
      doc.font('bold').fontSize(10).fillColor(m.kind === 'fault' ? BAD : INK).text(`${i + 1}. ${m.kind === 'fault' ? 'FAULT' : 'NOTE'}${m.target ? ` at ${m.target}` : ''}: `, left, doc.y, { continued: true, width });
      doc.font('body').fillColor(INK).text(m.text);
    });
    if (d.notes) para(d.notes);
  }

  if (input.readingSets.length) {
    heading('Readings');
    for (const set of input.readingSets) {
      ensure(50);
      const by = typeof set.takenBy === 'string' ? set.takenBy : set.takenBy?.name;
      doc.font('bold').fontSize(11).fillColor(INK).text(`Taken ${stamp(new Date(set.takenAt))}${by ? ` by ${by}` : ''}`, left, doc.y, { width });
      const cols = [left, left + 150, left + 250, left + 340, left + 430];
      const row = (cells: string[], fonts: string[], colors: string[]) => {
        ensure(16);
        const y = doc.y;
        cells.forEach((c, i) => doc.font(fonts[i]).fontSize(10).fillColor(colors[i]).text(c, cols[i], y, { width: (cols[i + 1] ?? left + width) - cols[i] - 6, lineBreak: false, ellipsis: true }));
        doc.y = y + 15;
        doc.x = left;
      };
      row(['Point', 'State', 'Measured', 'Expected', 'Result'], ['bold', 'bold', 'bold', 'bold', 'bold'], [MUTED, MUTED, MUTED, MUTED, MUTED]);
      for (const r of set.readings) {
        const result = r.inRange === true ? 'in range' : r.inRange === false ? 'OUT of range' : 'no check';
        row(
          [readingPointText(r), readingStateText(r), readingMeasuredText(r), readingExpectedText(r), result],
          ['body', 'body', 'body', 'body', 'bold'],
          [INK, INK, INK, INK, r.inRange === false ? BAD : r.inRange === true ? OK : MUTED],
        );
      }
      if (set.suspects?.length) {
        ensure(30);
        doc.moveDown(0.2);
        doc.font('bold').fontSize(10).fillColor(INK).text('Suspects at the time (most likely first):', left, doc.y, { width });
        set.suspects.slice(0, 5).forEach((s, i) => doc.font('body').text(`${i + 1}. ${suspectText(s)}`, left + 8, doc.y, { width: width - 8 }));
      }
      doc.moveDown(0.6);
    }
  }

  if (photos.length) {
    heading('Photos', 220);
    const colW = (width - 12) / 2;
    for (let i = 0; i < photos.length; i += 2) {
      const pair = photos.slice(i, i + 2);
      const metas = await Promise.all(pair.map((p) => sharp(p.jpeg).metadata()));
      const heights = metas.map((m) => Math.min(((m.height ?? 1) / (m.width ?? 1)) * colW, 260));
      const h = Math.max(...heights);
      ensure(h + 30);
      const y = doc.y;
      pair.forEach((p, j) => {
        const x = left + j * (colW + 12);
        doc.image(p.jpeg, x, y, { fit: [colW, h] });
        doc.font('body').fontSize(9).fillColor(MUTED).text(p.caption ?? p.filename, x, y + h + 3, { width: colW, lineBreak: false, ellipsis: true });
      });
      doc.y = y + h + 22;
      doc.x = left;
    }
  }

  heading('Safety');
  for (const c of input.cautions) {
    ensure(40);
    doc.font('bold').fontSize(10).fillColor(CAUTION).text(`CAUTION: ${c.title}`, left, doc.y, { width });
    doc.font('body').fontSize(10).fillColor(INK).text(c.text, { width });
    doc.moveDown(0.3);
  }

  // Footer on every page.
  const range = doc.bufferedPageRange();
  for (let i = 0; i < range.count; i++) {
    doc.switchToPage(range.start + i);
    // Below the bottom margin: lift the margin so pdfkit does not start a new page.
    doc.page.margins.bottom = 0;
    const y = doc.page.height - 40;
    doc.font('body').fontSize(8).fillColor(MUTED).text(`${input.shopName} · repair order ${input.number} · page ${i + 1} of ${range.count}`, left, y, { width, align: 'center', lineBreak: false });
  }
  doc.end();
  return done;
}
