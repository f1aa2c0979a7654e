/**
 * The audit as a PDF for people: a cover with the readiness verdict and the gaps, the ancestry by
 * generation, every step, the evidence with micrograph thumbnails, the file checks and the
 * history chain check; embedded IBM Plex fonts and "page N of M" on every page.
 */
import path from 'node:path';
import PDFDocument from 'pdfkit';
import { AUDIT_GAP_LABELS, type AuditGap, type AuditRecord } from '../../../shared/schemas/audit';
import { SAMPLE_KIND_LABELS } from '../../../shared/samples';
import { formatLengthUm, formatNumber } from '../../../shared/zone-plate/format';
import type { AuditCollection, AuditFileStore } from './collect';

const fontFile = (pkg: string, file: string) => path.join(path.dirname(require.resolve(`${pkg}/package.json`)), file);
const FONTS = {
  sans: fontFile('@expo-google-fonts/ibm-plex-sans', '400Regular/IBMPlexSans_400Regular.ttf'),
  bold: fontFile('@expo-google-fonts/ibm-plex-sans', '700Bold/IBMPlexSans_700Bold.ttf'),
  // The regular (400) mono file trips pdfkit's font subsetter; medium (500) embeds cleanly.
  mono: fontFile('@expo-google-fonts/ibm-plex-mono', '500Medium/IBMPlexMono_500Medium.ttf'),
};

/**
 * pdfkit's font engine cannot lay out the mono font's space glyph (it throws), so mono is only
 * used for single words (codes, hashes, times); `mixed` and `columns` set them among sans text.
 */
const MARGIN = 50;
const FOOTER_GAP = 22;
const THUMBNAIL_PT = 72;
const COLOURS = { text: '#1b1f23', muted: '#5b636b', ready: '#1d6b3a', notReady: '#9b1c1c', rule: '#c9ced3' };

const when = (value: string | null) => (value ? `${value.slice(0, 16).replace('T', ' ')} UTC` : 'not recorded');
const layers = (value: number | null) =>
  value === null ? 'no layer call' : `${formatNumber(value)} ${value === 1 ? 'layer' : 'layers'}`;

function describeRecord(record: AuditRecord): string {
  const parts = [
    SAMPLE_KIND_LABELS[record.kind],
    record.material,
    record.name,
    layers(record.layerEstimate),
    `owner ${record.owner.displayName}`,
  ];
  return parts.filter(Boolean).join(' · ');
}

function parameterText(value: unknown): string {
  if (value === null || value === undefined) return '—';
  if (typeof value === 'object') return JSON.stringify(value);
  return String(value);
}

export async function auditPdf(audit: AuditCollection, gaps: AuditGap[], files: AuditFileStore): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margin: MARGIN,
    bufferPages: true,
    info: { Title: `Flakeline audit of ${audit.subject.code}`, Creator: 'Flakeline', Subject: 'Provenance audit' },
  });
  doc.registerFont('sans', FONTS.sans);
  doc.registerFont('bold', FONTS.bold);
  doc.registerFont('mono', FONTS.mono);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const width = doc.page.width - 2 * MARGIN;
  const bottom = () => doc.page.height - MARGIN - FOOTER_GAP;
  const ensureRoom = (height: number) => {
    if (doc.y + height > bottom()) doc.addPage();
  };
  const heading = (text: string) => {
    ensureRoom(60);
    doc.moveDown(0.6).font('bold').fontSize(15).fillColor(COLOURS.text).text(text, MARGIN, doc.y, { width });
    doc
      .moveTo(MARGIN, doc.y + 2)
      .lineTo(MARGIN + width, doc.y + 2)
      .strokeColor(COLOURS.rule)
      .lineWidth(0.5)
      .stroke();
    doc.moveDown(0.5);
  };
  const subheading = (text: string) => {
    ensureRoom(40);
    doc.moveDown(0.3).font('bold').fontSize(11).fillColor(COLOURS.text).text(text, MARGIN, doc.y, { width });
  };
  type LineOptions = { font?: 'sans' | 'bold'; size?: number; colour?: string; indent?: number };
  const line = (text: string, options: LineOptions = {}) => {
    const indent = options.indent ?? 0;
    doc
      .font(options.font ?? 'sans')
      .fontSize(options.size ?? 9.5)
      .fillColor(options.colour ?? COLOURS.text)
      .text(text, MARGIN + indent, doc.y, { width: width - indent });
  };
  /** One paragraph of sans text with mono words (without spaces) in between. */
  const mixed = (parts: [text: string, font: 'sans' | 'mono'][], options: Omit<LineOptions, 'font'> = {}) => {
    const indent = options.indent ?? 0;
    doc.fontSize(options.size ?? 9.5).fillColor(options.colour ?? COLOURS.text);
    parts.forEach(([text, font], index) => {
      const continued = index < parts.length - 1;
      doc.font(font);
      if (index === 0) doc.text(text, MARGIN + indent, doc.y, { width: width - indent, continued });
      else doc.text(text, { continued });
    });
  };
  /** A table row: each cell at its own offset from the margin, on one line; mono only for words without spaces. */
  const columns = (
    cells: { text: string; at: number; font: 'sans' | 'mono' | 'bold' }[],
    size: number,
    colour = COLOURS.text,
  ) => {
    const top = doc.y;
    for (const cell of cells) {
      const font = cell.font === 'mono' && cell.text.includes(' ') ? 'sans' : cell.font;
      doc
        .font(font)
        .fontSize(size)
        .fillColor(colour)
        .text(cell.text, MARGIN + cell.at, top, { lineBreak: false });
    }
    doc.x = MARGIN;
    doc.y = top + size * 1.5;
  };
  /** A record code in mono followed by plain text on the same line. */
  const codeLine = (code: string, rest: string, indent = 0) => {
    doc
      .font('mono')
      .fontSize(9.5)
      .fillColor(COLOURS.text)
      .text(code, MARGIN + indent, doc.y, { continued: true, width: width - indent });
    doc.font('sans').text(`  ${rest}`);
  };

  // Cover ---------------------------------------------------------------------------------------
  const ready = gaps.length === 0;
  const subject = audit.subject;
  doc.font('sans').fontSize(10).fillColor(COLOURS.muted).text('Flakeline · provenance audit', MARGIN, MARGIN);
  doc.moveDown(1.5).font('mono').fontSize(26).fillColor(COLOURS.text).text(subject.code);
  line(describeRecord(subject), { size: 12 });
  line(`Audit made ${when(audit.generatedAt)}`, { colour: COLOURS.muted });
  doc.moveDown(1);
  const verdictTop = doc.y;
  doc.rect(MARGIN, verdictTop, width, 56).fill(ready ? COLOURS.ready : COLOURS.notReady);
  doc
    .font('bold')
    .fontSize(20)
    .fillColor('#ffffff')
    .text(ready ? 'Ready to publish' : 'Not ready to publish', MARGIN + 14, verdictTop + 9, { width: width - 28 });
  doc
    .font('sans')
    .fontSize(10)
    .text(
      ready
        ? 'No gaps found in the record.'
        : `${gaps.length} ${gaps.length === 1 ? 'gap' : 'gaps'} to close or explain (listed below).`,
      {
        width: width - 28,
      },
    );
  doc.y = verdictTop + 70;

  const ancestors = audit.records.filter((record) => record.generation < 0);
  const sources = audit.records.filter((record) => record.isSource);
  const deepest = Math.min(0, ...audit.records.map((record) => record.generation));
  const intact = audit.evidence.filter((item) => item.file.check === 'intact').length;
  const summary = [
    `Ancestry: ${ancestors.length} ${ancestors.length === 1 ? 'ancestor' : 'ancestors'} over ${-deepest} ${deepest === -1 ? 'generation' : 'generations'}; ${sources.length} ${sources.length === 1 ? 'source' : 'sources'} (${sources.map((s) => s.code).join(', ') || 'none'}).`,
    `Steps: ${audit.steps.length}. Evidence items: ${audit.evidence.length}; files intact now: ${intact} of ${audit.evidence.length}.`,
    audit.chain.intact
      ? `History chain: intact, ${audit.chain.checked} events recomputed; head ${audit.chain.headHash ?? '(empty)'}.`
      : `History chain: BROKEN at event ${audit.chain.firstBroken?.eventId} — ${audit.chain.firstBroken?.reason}.`,
  ];
  for (const text of summary) line(text);
  if (audit.lensDesign) {
    const lens = audit.lensDesign;
    doc.moveDown(0.4);
    line(
      `Lens design: Fresnel zone plate, ${formatNumber(lens.wavelengthNm)} nm, f = ${formatLengthUm(lens.focalLengthUm)}, ${lens.zoneCount} zones, ${formatLengthUm(lens.lensDiameterUm)} across, outermost zone ${formatNumber(lens.outermostZoneWidthUm * 1000)} nm, NA ${formatNumber(lens.numericalAperture)}.`,
    );
  }

  heading(ready ? 'Readiness: no gaps' : 'Readiness: gaps');
  if (ready)
    line(
      'Every step names its operator and time, every flake and film has agreeing thickness evidence, every file is intact and nothing was changed after the record was made.',
    );
  for (const entry of gaps) {
    ensureRoom(30);
    line(AUDIT_GAP_LABELS[entry.kind], { font: 'bold', colour: COLOURS.notReady });
    line(entry.message, { indent: 10 });
    doc.moveDown(0.2);
  }

  // Ancestry --------------------------------------------------------------------------------------
  heading('Ancestry by generation');
  const generations = [...new Set(audit.records.map((record) => record.generation))].sort((a, b) => b - a);
  for (const generation of generations) {
    subheading(
      generation === 0
        ? 'The audited record'
        : `Generation ${generation} (${-generation} ${generation === -1 ? 'step' : 'steps'} back)`,
    );
    for (const record of audit.records.filter((entry) => entry.generation === generation)) {
      ensureRoom(30);
      codeLine(record.code, describeRecord(record));
      const origin = record.parentCodes.length
        ? `from ${record.parentCodes.join(', ')} by step ${record.madeByStepIds.join(', ')}`
        : record.isSource
          ? 'source: begins the ancestry'
          : 'no recorded parents';
      line(origin, { indent: 10, colour: COLOURS.muted, size: 8.5 });
    }
  }

  // Steps -----------------------------------------------------------------------------------------
  heading('Steps');
  if (!audit.steps.length) line('No logged steps made these records.');
  for (const step of audit.steps) {
    ensureRoom(60);
    line(`Step ${step.id} · ${step.label}`, { font: 'bold' });
    line(
      `Operator: ${step.operator?.displayName ?? 'none recorded'} · started ${when(step.startedAt)} · ended ${when(step.endedAt)}${step.instrument ? ` · instrument ${step.instrument}` : ''}`,
      { indent: 10 },
    );
    const flow = [
      step.inputCodes.length ? `used ${step.inputCodes.join(', ')}` : null,
      step.outputCodes.length ? `made ${step.outputCodes.join(', ')}` : null,
      step.treatedCodes.length ? `treated ${step.treatedCodes.join(', ')}` : null,
    ].filter(Boolean);
    line(flow.length ? flow.join(' → ').replace(/^./, (first) => first.toUpperCase()) : 'No records recorded', {
      indent: 10,
      size: 8.5,
    });
    const parameters = Object.entries(step.parameters);
    if (parameters.length) {
      line(parameters.map(([key, value]) => `${key}: ${parameterText(value)}`).join(' · '), {
        indent: 10,
        size: 8.5,
        colour: COLOURS.muted,
      });
    }
    if (step.notes) line(`Notes: ${step.notes}`, { indent: 10, size: 8.5, colour: COLOURS.muted });
    doc.moveDown(0.3);
  }

  // Evidence ----------------------------------------------------------------------------------------
  heading('Thickness evidence');
  if (!audit.evidence.length) line('No evidence is attached to these records or steps.');
  for (const item of audit.evidence) {
    let thumbnail: Buffer | null = null;
    if (item.kind === 'micrograph' && item.file.thumbnailSha256) {
      try {
        thumbnail = await files.read(item.file.thumbnailSha256);
      } catch {
        thumbnail = null; // Shown as unavailable; the file check below reports the original.
      }
    }
    ensureRoom(thumbnail ? THUMBNAIL_PT + 12 : 44);
    const top = doc.y;
    const indent = thumbnail ? THUMBNAIL_PT + 10 : 0;
    if (thumbnail) {
      try {
        doc.image(thumbnail, MARGIN, top, { fit: [THUMBNAIL_PT, THUMBNAIL_PT] });
      } catch {
        doc.font('sans').fontSize(7).fillColor(COLOURS.muted).text('thumbnail unreadable', MARGIN, top, { width: THUMBNAIL_PT });
      }
      doc.y = top;
    }
    line(`#${item.id} · ${item.kind}${item.sampleCode ? ` on ${item.sampleCode}` : ` on step ${item.stepId}`}`, {
      font: 'bold',
      indent,
    });
    const call =
      item.layerCount === null
        ? 'no layer count'
        : `${item.layerCount} ${item.layerCount === 1 ? 'layer' : 'layers'}${item.layerUncertainty !== null ? ` ± ${formatNumber(item.layerUncertainty)}` : ''}${item.layerMethod ? ` by ${item.layerMethod}` : ''}`;
    line(`${call} · added ${when(item.createdAt)} by ${item.createdBy?.displayName ?? 'unknown'}`, { indent });
    mixed(
      [
        [`${item.originalName ?? 'file'} · SHA-256 `, 'sans'],
        [item.file.sha256, 'mono'],
        [` · ${item.file.check} now`, 'sans'],
      ],
      { indent, size: 7.5, colour: COLOURS.muted },
    );
    if (thumbnail) doc.y = Math.max(doc.y, top + THUMBNAIL_PT + 4);
    doc.moveDown(0.4);
  }

  // Files -------------------------------------------------------------------------------------------
  heading('File checks (recomputed now)');
  const checkedFiles = new Map(audit.evidence.map((item) => [item.file.sha256, item.file]));
  if (!checkedFiles.size) line('No files to check.');
  for (const file of checkedFiles.values()) {
    ensureRoom(16);
    columns(
      [
        { text: file.check, at: 0, font: 'bold' },
        { text: file.sha256, at: 44, font: 'mono' },
        { text: `${file.mediaType}, ${file.byteSize} bytes`, at: 340, font: 'sans' },
      ],
      7.5,
      file.check === 'intact' ? COLOURS.text : COLOURS.notReady,
    );
  }

  // History chain -------------------------------------------------------------------------------------
  heading('History chain');
  line(
    audit.chain.intact
      ? `The whole chain of ${audit.chain.checked} events was recomputed from its stored text and is intact.`
      : `The chain fails at event ${audit.chain.firstBroken?.eventId}: ${audit.chain.firstBroken?.reason}.`,
  );
  if (audit.chain.headHash)
    mixed(
      [
        ['Head hash: ', 'sans'],
        [audit.chain.headHash, 'mono'],
      ],
      { size: 8 },
    );
  doc.moveDown(0.4);
  ensureRoom(50);
  line(`Events about these records (${audit.events.length}):`, { font: 'bold' });
  const eventColumns = [0, 34, 124, 234, 300];
  columns(
    ['Event', 'Time (UTC)', 'Type', 'About', 'SHA-256 (first 32 digits)'].map((text, index) => ({
      text,
      at: eventColumns[index],
      font: 'bold' as const,
    })),
    7,
    COLOURS.muted,
  );
  for (const event of audit.events) {
    ensureRoom(14);
    columns(
      [
        { text: String(event.id), at: eventColumns[0], font: 'mono' },
        { text: `${event.occurredAt.slice(0, 19)}Z`, at: eventColumns[1], font: 'mono' },
        { text: event.type, at: eventColumns[2], font: 'mono' },
        { text: event.subjectCode ?? `step ${event.stepId}`, at: eventColumns[3], font: 'mono' },
        { text: `${event.hash.slice(0, 32)}…`, at: eventColumns[4], font: 'mono' },
      ],
      7,
    );
  }

  // Page numbers -------------------------------------------------------------------------------------
  const range = doc.bufferedPageRange();
  for (let index = range.start; index < range.start + range.count; index += 1) {
    doc.switchToPage(index);
    // Writing below the bottom margin would start a new page; lift it while the footer is written.
    const margins = doc.page.margins;
    doc.page.margins = { ...margins, bottom: 0 };
    doc
      .font('sans')
      .fontSize(8)
      .fillColor(COLOURS.muted)
      .text(
        `Audit of ${subject.code} · ${when(audit.generatedAt)} · page ${index + 1} of ${range.count}`,
        MARGIN,
        doc.page.height - MARGIN,
        {
          width,
          align: 'center',
          lineBreak: false,
        },
      );
    doc.page.margins = margins;
  }
  doc.end();
  return done;
}
