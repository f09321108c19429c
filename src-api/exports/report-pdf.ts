import path from 'node:path';
import PDFDocument from 'pdfkit';

/**
 * The page furniture the NCR and 8D reports share: the same A4 layout, Open Sans TTFs, headings,
 * fact pairs and page-breaking tables as the lot inspection report, with the running header
 * given by the caller instead of taken from a lot.
 */

/** The product's shipped font, as TrueType: pdfkit cannot embed WOFF2. */
const FONT_DIR = path.join(path.dirname(require.resolve('open-sans-fonts/package.json')), 'open-sans');
const FONTS = {
  regular: path.join(FONT_DIR, 'Regular/OpenSans-Regular.ttf'),
  semibold: path.join(FONT_DIR, 'Semibold/OpenSans-Semibold.ttf'),
  bold: path.join(FONT_DIR, 'Bold/OpenSans-Bold.ttf'),
};

export const INK = '#1d2726';
export const MUTED = '#56625f';
export const TEAL = '#0c3d39';
export const RULE = '#c9d6d3';
const ZEBRA = '#f1f6f5';
export const BAD = '#b3261e';
export const GOOD = '#1d7a3e';

export const M = { top: 64, bottom: 56, left: 48, right: 48 };

export interface Col {
  header: string;
  width: number;
  align?: 'left' | 'right' | 'center';
}
export interface Cell {
  text: string;
  colour?: string;
  bold?: boolean;
}

export interface ReportMeta {
  /** Running title, top left of every page. */
  title: string;
  /** Running subject, top right of every page (e.g. the NCR number). */
  subject: string;
  generatedAt: Date;
  generatedBy: string;
}

type Doc = PDFKit.PDFDocument;

export class ReportDoc {
  readonly doc: Doc;
  readonly width: number;
  private readonly chunks: Buffer[] = [];
  private readonly done: Promise<Buffer>;

  constructor(private readonly meta: ReportMeta) {
    this.doc = new PDFDocument({
      size: 'A4',
      margins: M,
      bufferPages: true,
      font: FONTS.regular,
      info: { Title: `${meta.title} — ${meta.subject}`, Author: 'Yokeline', Subject: meta.subject, Creator: 'Yokeline' },
    });
    this.doc.registerFont('regular', FONTS.regular);
    this.doc.registerFont('semibold', FONTS.semibold);
    this.doc.registerFont('bold', FONTS.bold);
    this.width = this.doc.page.width - M.left - M.right;
    this.done = new Promise<Buffer>((resolve, reject) => {
      this.doc.on('data', (c: Buffer) => this.chunks.push(c));
      this.doc.on('end', () => resolve(Buffer.concat(this.chunks)));
      this.doc.on('error', reject);
    });
  }

  private get bottom(): number {
    return this.doc.page.height - M.bottom;
  }

  ensure(h: number): void {
    if (this.doc.y + h > this.bottom) this.doc.addPage();
  }

  title(big: string, small: string): void {
    this.doc.font('bold').fontSize(18).fillColor(INK).text(big, M.left, M.top, { continued: true });
    this.doc.font('regular').fontSize(12).fillColor(MUTED).text(`   ${small}`);
    this.doc.moveDown(0.2);
  }

  heading(text: string): void {
    // A heading never ends a page alone: room for it, a caption, a table header and rows.
    this.ensure(100);
    this.doc.moveDown(0.8);
    this.doc.font('bold').fontSize(12).fillColor(TEAL).text(text, M.left, this.doc.y, { width: this.width });
    const y = this.doc.y + 2;
    this.doc.moveTo(M.left, y).lineTo(M.left + this.width, y).lineWidth(0.6).strokeColor(RULE).stroke();
    this.doc.y = y + 6;
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  para(text: string, opts: { colour?: string; font?: 'regular' | 'semibold' | 'bold'; size?: number } = {}): void {
    this.doc.font(opts.font ?? 'regular').fontSize(opts.size ?? 9).fillColor(opts.colour ?? INK);
    this.ensure(this.doc.heightOfString(text, { width: this.width }) + 2);
    this.doc.text(text, M.left, this.doc.y, { width: this.width });
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  /** Label / value pairs in two columns of pairs. */
  facts(pairs: [string, string][]): void {
    const colW = this.width / 2;
    const labelW = 92;
    for (let i = 0; i < pairs.length; i += 2) {
      const row = pairs.slice(i, i + 2);
      this.doc.fontSize(9);
      const h = Math.max(...row.map(([, v]) => this.doc.font('regular').heightOfString(v || '—', { width: colW - labelW - 8 }))) + 4;
      this.ensure(h);
      const y = this.doc.y;
      row.forEach(([k, v], j) => {
        const x = M.left + j * colW;
        this.doc.font('semibold').fillColor(MUTED).text(k, x, y, { width: labelW - 4 });
        this.doc.font('regular').fillColor(INK).text(v || '—', x + labelW, y, { width: colW - labelW - 8 });
      });
      this.doc.y = y + h;
    }
  }

  /** A table that breaks across pages and repeats its header row. */
  table(cols: Col[], rows: Cell[][], caption?: string): void {
    const pad = 3;
    const total = cols.reduce((s, c) => s + c.width, 0);
    const drawHeader = () => {
      const h = Math.max(...cols.map((c) => this.doc.font('semibold').fontSize(8).heightOfString(c.header, { width: c.width - 2 * pad }))) + 2 * pad;
      const y = this.doc.y;
      this.doc.rect(M.left, y, total, h).fill(TEAL);
      let x = M.left;
      for (const c of cols) {
        this.doc.font('semibold').fontSize(8).fillColor('#ffffff').text(c.header, x + pad, y + pad, { width: c.width - 2 * pad, align: c.align ?? 'left' });
        x += c.width;
      }
      this.doc.y = y + h;
    };
    // Keep the caption, the header and the first rows together.
    this.ensure(64);
    if (caption) this.para(caption, { colour: MUTED, size: 8 });
    drawHeader();
    rows.forEach((row, ri) => {
      const h = Math.max(...row.map((cell, i) => this.doc.font(cell.bold ? 'semibold' : 'regular').fontSize(8).heightOfString(cell.text, { width: cols[i].width - 2 * pad }))) + 2 * pad;
      if (this.doc.y + h > this.bottom) {
        this.doc.addPage();
        drawHeader();
      }
      const y = this.doc.y;
      if (ri % 2 === 1) this.doc.rect(M.left, y, total, h).fill(ZEBRA);
      let x = M.left;
      row.forEach((cell, i) => {
        this.doc.font(cell.bold ? 'semibold' : 'regular').fontSize(8).fillColor(cell.colour ?? INK).text(cell.text, x + pad, y + pad, { width: cols[i].width - 2 * pad, align: cols[i].align ?? 'left' });
        x += cols[i].width;
      });
      this.doc.y = y + h;
    });
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  /** Thumbnails in rows, each framed and captioned; an unreadable image says so instead of failing the report. */
  photos(items: { image: Buffer | null; caption: string | null }[]): void {
    const size = 112;
    const gap = 12;
    const perRow = Math.floor((this.width + gap) / (size + gap));
    for (let i = 0; i < items.length; i += perRow) {
      this.ensure(size + 28);
      const y = this.doc.y;
      items.slice(i, i + perRow).forEach((p, j) => {
        const x = M.left + j * (size + gap);
        this.doc.rect(x, y, size, size).lineWidth(0.5).strokeColor(RULE).stroke();
        if (p.image) {
          try {
            this.doc.image(p.image, x + 1, y + 1, { fit: [size - 2, size - 2], align: 'center', valign: 'center' });
          } catch {
            this.doc.font('regular').fontSize(8).fillColor(MUTED).text('image unreadable', x + 4, y + size / 2 - 4, { width: size - 8, align: 'center' });
          }
        } else this.doc.font('regular').fontSize(8).fillColor(MUTED).text('image unavailable', x + 4, y + size / 2 - 4, { width: size - 8, align: 'center' });
        this.doc.font('regular').fontSize(7).fillColor(MUTED).text(p.caption ?? '', x, y + size + 3, { width: size, height: 20, ellipsis: true });
      });
      this.doc.y = y + size + 26;
    }
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  /** Header and page numbers on every page, drawn once all pages exist; then the file. */
  end(): Promise<Buffer> {
    const range = this.doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      this.doc.switchToPage(i);
      // Writing inside the margins would otherwise start a new page.
      const bottomMargin = this.doc.page.margins.bottom;
      this.doc.page.margins.bottom = 0;
      this.doc.font('bold').fontSize(10).fillColor(TEAL).text(this.meta.title, M.left, 28, { width: this.width * 0.6, lineBreak: false });
      this.doc.font('regular').fontSize(9).fillColor(MUTED).text(this.meta.subject, M.left + this.width * 0.5, 29, { width: this.width * 0.5, align: 'right', lineBreak: false });
      this.doc.moveTo(M.left, 46).lineTo(M.left + this.width, 46).lineWidth(1.2).strokeColor('#b4652e').stroke();
      const fy = this.doc.page.height - 36;
      this.doc.font('regular').fontSize(8).fillColor(MUTED).text(`Generated ${utc(this.meta.generatedAt)} by ${this.meta.generatedBy}`, M.left, fy, { width: this.width * 0.7, lineBreak: false });
      this.doc.text(`Page ${i - range.start + 1} of ${range.count}`, M.left + this.width * 0.6, fy, { width: this.width * 0.4, align: 'right', lineBreak: false });
      this.doc.page.margins.bottom = bottomMargin;
    }
    this.doc.end();
    return this.done;
  }
}

export const utc = (d: Date | string | null | undefined): string => (d ? `${new Date(d).toISOString().slice(0, 16).replace('T', ' ')} UTC` : '—');
/** Money as written on a cost line: two decimals, no currency assumed. */
export const money = (v: number | null | undefined): string => (v == null ? '—' : v.toFixed(2));
