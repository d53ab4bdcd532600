import { Document, Font, Image, Page, StyleSheet, Text, View } from '@react-pdf/renderer';
import path from 'node:path';
import {
  customerReport,
  firstChecklists,
  REPORT_DEFERRAL,
  shownValue,
  VERDICT_ICONS,
  VERDICT_WORDS,
  type ReportVersion,
} from '@/lib/pdf/report-model';
import type { CallReportOut } from '@/lib/validations/api';

// The service report as a PDF (@react-pdf/renderer): the same two versions as the web page, drawn
// with fonts embedded from fonts/. The app's own sans (Inter) ships only as a variable WOFF2, which
// the PDF renderer cannot subset, so text is set in DejaVu Sans (a TTF with the µ, Ω, ✓ and arrow
// glyphs readings need) and readings in JetBrains Mono (WOFF) as on screen.

const FONTS = path.join(process.cwd(), 'fonts');
let registered = false;
function registerFonts() {
  if (registered) return;
  Font.register({
    family: 'Report Sans',
    fonts: [
      { src: path.join(FONTS, 'DejaVuSans.ttf'), fontWeight: 400 },
      { src: path.join(FONTS, 'DejaVuSans-Bold.ttf'), fontWeight: 700 },
    ],
  });
  Font.register({
    family: 'Report Mono',
    fonts: [
      { src: path.join(FONTS, 'jetbrains-mono-latin-400-normal.woff'), fontWeight: 400 },
      { src: path.join(FONTS, 'jetbrains-mono-latin-700-normal.woff'), fontWeight: 700 },
    ],
  });
  // Words are not split with hyphens: a test point or a band label reads as written.
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}

registerFonts();

/** ANSI Z535 colours of the signal words (the same as the app's cautions). */
const SIGNAL: Record<string, { bg: string; fg: string }> = {
  DANGER: { bg: '#c8102e', fg: '#ffffff' },
  WARNING: { bg: '#ff7900', fg: '#000000' },
  CAUTION: { bg: '#ffd100', fg: '#000000' },
  NOTICE: { bg: '#0057b8', fg: '#ffffff' },
};

const INK = '#1f2326';
const MUTED = '#4b5258';
const LINE = '#c9cdd1';

const s = StyleSheet.create({
  page: {
    fontFamily: 'Report Sans',
    fontSize: 9.5,
    color: INK,
    paddingTop: 36,
    paddingBottom: 54,
    paddingHorizontal: 42,
  },
  // The fonts' own line height: a lineHeight on the page makes the renderer drop the dynamic page-number text.
  body: {},
  header: {
    flexDirection: 'row',
    justifyContent: 'space-between',
    borderBottomWidth: 2,
    borderBottomColor: INK,
    paddingBottom: 8,
    marginBottom: 10,
  },
  company: { fontSize: 14, fontWeight: 700 },
  title: { fontSize: 16, fontWeight: 700, textAlign: 'right', lineHeight: 1.2, marginBottom: 2 },
  muted: { color: MUTED },
  right: { textAlign: 'right' },
  h2: { fontSize: 11.5, fontWeight: 700, marginTop: 10, marginBottom: 4 },
  meta: { flexDirection: 'row', flexWrap: 'wrap' },
  metaItem: { width: '50%', flexDirection: 'row', marginBottom: 2 },
  metaKey: { width: 78, color: MUTED },
  metaValue: { flex: 1, fontWeight: 700, paddingRight: 8 },
  bold: { fontWeight: 700 },
  mono: { fontFamily: 'Report Mono' },
  finding: { borderWidth: 1.5, borderColor: INK, borderRadius: 3, padding: 7, marginBottom: 6 },
  tableHead: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: INK, paddingBottom: 2, fontWeight: 700 },
  row: { flexDirection: 'row', borderBottomWidth: 0.5, borderBottomColor: LINE, paddingVertical: 2.5 },
  cReading: { width: '44%', paddingRight: 6 },
  cValue: { width: '18%', paddingRight: 6, fontFamily: 'Report Mono', fontWeight: 700 },
  cBand: { width: '38%' },
  step: { borderTopWidth: 0.5, borderTopColor: LINE, paddingVertical: 3 },
  stepHead: { flexDirection: 'row', justifyContent: 'space-between' },
  caution: { borderWidth: 2, borderRadius: 3, marginBottom: 5 },
  cautionWord: { fontSize: 10, fontWeight: 700, paddingHorizontal: 6, paddingVertical: 2, letterSpacing: 1 },
  cautionText: { paddingHorizontal: 6, paddingVertical: 4 },
  photos: { flexDirection: 'row', flexWrap: 'wrap' },
  // Thumbnails small enough that a visit's few photos keep the customer copy on one page.
  photo: { width: 84, height: 84, objectFit: 'cover', marginRight: 6, marginBottom: 6, borderWidth: 0.5, borderColor: LINE },
  footer: { borderTopWidth: 2, borderTopColor: INK, paddingTop: 6, marginTop: 12 },
  pageFoot: { position: 'absolute', bottom: 24, left: 42, right: 42, fontSize: 8, color: MUTED },
});

export interface ReportPhoto {
  id: string;
  /** The thumbnail's bytes (JPEG or PNG). */
  data: Buffer;
  format: 'jpg' | 'png';
}

function fmt(d: string | null | undefined, timeZone: string, withTime = true): string {
  if (!d) return '—';
  const options: Intl.DateTimeFormatOptions = withTime
    ? { year: 'numeric', month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit', timeZoneName: 'short' }
    : { year: 'numeric', month: 'short', day: 'numeric' };
  try {
    return new Intl.DateTimeFormat('en-US', { ...options, timeZone }).format(new Date(d));
  } catch {
    return new Intl.DateTimeFormat('en-US', { ...options, timeZone: 'UTC' }).format(new Date(d));
  }
}

const IGNITION: Record<string, string> = { 'two-rod': 'DSI, two-rod', 'single-rod': 'DSI, single-rod' };
const FUEL: Record<string, string> = { 'natural-gas': 'natural gas', lp: 'LP' };
const SUPPLY: Record<string, string> = { '24v': '24 V only', line: 'Line-powered control' };

function Meta({ items }: { items: [string, string][] }) {
  return (
    <View style={s.meta}>
      {items.map(([k, v]) => (
        <View key={k} style={s.metaItem}>
          <Text style={s.metaKey}>{k}</Text>
          <Text style={s.metaValue}>{v}</Text>
        </View>
      ))}
    </View>
  );
}

function verdictText(verdict: string | null, band: string | null): string {
  const word = verdict ? VERDICT_WORDS[verdict] : null;
  const icon = verdict ? VERDICT_ICONS[verdict] : null;
  return [word ? `${icon} ${word}` : null, band].filter(Boolean).join(' — ');
}

function Cautions({ cautions }: { cautions: CallReportOut['cautions'] }) {
  return (
    <>
      {cautions.map((c) => (
        <View key={`${c.signal}|${c.text}`} style={[s.caution, { borderColor: SIGNAL[c.signal].bg }]} wrap={false}>
          <Text style={[s.cautionWord, { backgroundColor: SIGNAL[c.signal].bg, color: SIGNAL[c.signal].fg }]}>
            {c.signal === 'NOTICE' ? '' : '⚠ '}
            {c.signal}
          </Text>
          <Text style={s.cautionText}>{c.text}</Text>
        </View>
      ))}
    </>
  );
}

function Header({ report, subtitle }: { report: CallReportOut; subtitle: string }) {
  const tz = report.company.timeZone;
  return (
    <View style={s.header}>
      <View>
        <Text style={s.company}>{report.company.name}</Text>
        {report.company.officeEmail && <Text style={s.muted}>{report.company.officeEmail}</Text>}
      </View>
      <View>
        <Text style={s.title}>Service report</Text>
        <Text style={[s.right, s.bold]}>{subtitle}</Text>
        <Text style={[s.right, s.muted]}>{fmt(report.call.closedAt ?? report.call.openedAt, tz, false)}</Text>
      </View>
    </View>
  );
}

function PageNumbers({ report }: { report: CallReportOut }) {
  const where = `${report.site.name} · ${report.unit.label}`;
  return <Text style={s.pageFoot} fixed render={({ pageNumber, totalPages }) => `${where} · Page ${pageNumber} of ${totalPages}`} />;
}

function Photos({ photos }: { photos: ReportPhoto[] }) {
  if (photos.length === 0) return null;
  return (
    <View wrap={false}>
      <Text style={s.h2}>Photos</Text>
      <View style={s.photos}>
        {photos.map((p) => (
          // eslint-disable-next-line jsx-a11y/alt-text -- a PDF image has no alt attribute
          <Image key={p.id} style={s.photo} src={{ data: p.data, format: p.format }} />
        ))}
      </View>
    </View>
  );
}

function CustomerPages({ report, photos }: { report: CallReportOut; photos: ReportPhoto[] }) {
  const { company, call, unit, site } = report;
  const tz = company.timeZone;
  const c = customerReport(report);
  return (
    <Page size="LETTER" style={s.page}>
      <PageNumbers report={report} />
      <View style={s.body}>
        <Header report={report} subtitle="Customer copy" />
        <Meta
          items={[
            ['Site', site.name],
            ['Address', site.address],
            ['Appliance', `${unit.label} (${IGNITION[unit.ignition]}, ${FUEL[unit.fuel]})`],
            ['Technician', c.technician ?? '—'],
          ]}
        />
        <Text style={{ marginTop: 3 }}>
          <Text style={s.muted}>You told us: </Text>
          {call.complaint}
        </Text>

        <Text style={s.h2}>What we found</Text>
        {c.findings.length === 0 && c.open.length === 0 && <Text>No diagnosis was run on this visit.</Text>}
        {c.findings.map((f) => (
          <View key={f.diagnosisId} wrap={false} style={{ marginBottom: 4 }}>
            <Text style={s.bold}>◆ {f.title}</Text>
            <Text>{f.explanation}</Text>
          </View>
        ))}
        {c.open.map((o, i) => (
          <Text key={i}>{o}</Text>
        ))}

        {(c.findings.length > 0 || c.repairNotes) && (
          <View wrap={false}>
            <Text style={s.h2}>What we did</Text>
            {c.findings.map((f) => (
              <View key={f.diagnosisId} style={{ marginBottom: 3 }}>
                <Text>{f.remedy}</Text>
                {f.parts.length > 0 && (
                  <Text>
                    <Text style={s.bold}>Parts: </Text>
                    {f.parts.join(', ')}
                  </Text>
                )}
                <Text style={s.bold}>{f.verified ? '✓ Repaired and checked before we left.' : 'The repair is not yet verified.'}</Text>
              </View>
            ))}
            {c.repairNotes && <Text>{c.repairNotes}</Text>}
          </View>
        )}

        {c.readings.length > 0 && (
          <View>
            <Text style={s.h2}>Readings</Text>
            <View style={s.tableHead}>
              <Text style={s.cReading}>Reading</Text>
              <Text style={[s.cValue, { fontFamily: 'Report Sans' }]}>Value</Text>
              <Text style={s.cBand}>Against its range</Text>
            </View>
            {c.readings.map((r) => (
              <View key={r.id} style={s.row} wrap={false}>
                <Text style={s.cReading}>
                  {r.title}
                  {r.afterRepair && !/after the repair/i.test(r.title) ? ' (after the repair)' : ''}
                </Text>
                <Text style={s.cValue}>{r.shown}</Text>
                <Text style={s.cBand}>{verdictText(r.verdict, r.band)}</Text>
              </View>
            ))}
          </View>
        )}

        {(c.checks.length > 0 || c.cycles !== null) && (
          <View wrap={false}>
            <Text style={s.h2}>Verification</Text>
            {c.cycles !== null && (
              <Text>
                Heat cycles run: <Text style={s.bold}>{c.cycles}</Text>
                {c.flameSignal ? ` · flame signal after the repair: ${c.flameSignal}` : ''}
              </Text>
            )}
            {c.checks.map((k, i) => (
              <Text key={i}>
                <Text style={s.bold}>{k.done ? '✓ ' : '✗ '}</Text>
                {k.text}
              </Text>
            ))}
          </View>
        )}

        <Photos photos={photos} />

        {c.cautions.length > 0 && (
          <View>
            <Text style={s.h2}>Please read</Text>
            <Cautions cautions={c.cautions} />
          </View>
        )}

        <View style={s.footer} wrap={false}>
          <Text style={s.bold}>{REPORT_DEFERRAL}</Text>
          <Text style={s.muted}>
            {c.technician ? `Work by ${c.technician}` : 'Work recorded'}
            {c.signedOff.map((x) => `; signed off by ${x.by ?? 'a technician'}, ${fmt(x.at, tz)}`).join('')}.
            {call.closedByName
              ? ` ${call.status === 'referred' ? 'Referred' : 'Closed'} by ${call.closedByName}, ${fmt(call.closedAt, tz)}.`
              : ''}
          </Text>
          {company.officeEmail && <Text style={s.muted}>Questions about this visit: {company.officeEmail}</Text>}
        </View>
      </View>
    </Page>
  );
}

function stepAnswer(step: CallReportOut['diagnoses'][number]['steps'][number]): string {
  if (step.choice) return step.choiceLabel ?? step.choice;
  return '✓ Confirmed';
}

const PROCEDURE: Record<string, string> = { 'lock-out': 'Lock-out: ', 're-energize': 'Re-energize: ', energy: 'Energy: ' };

function OfficePages({ report, photos }: { report: CallReportOut; photos: ReportPhoto[] }) {
  const { company, call, unit, site, diagnoses, cautions, events } = report;
  const tz = company.timeZone;
  const first = firstChecklists(diagnoses);
  const v = call.verification;
  return (
    <Page size="LETTER" style={s.page}>
      <PageNumbers report={report} />
      <View style={s.body}>
        <Header report={report} subtitle="Office record" />
        <Meta
          items={[
            ['Site', site.name],
            ['Address', site.address],
            ['Customer', site.contactEmail ?? '—'],
            ['Opened', fmt(call.openedAt, tz)],
            ['Technician', call.technicianName ?? '—'],
            ['Status', call.status],
            ['Unit', unit.label],
            ['Ignition', IGNITION[unit.ignition]],
            ['Fuel', FUEL[unit.fuel]],
            ['Supply', SUPPLY[unit.controlSupply]],
            ['Transformer', `${unit.transformerVa} VA`],
            ['Installed', unit.installYear ? String(unit.installYear) : '—'],
          ]}
        />
        <Text style={{ marginTop: 3 }}>
          <Text style={s.muted}>Complaint: </Text>
          {call.complaint}
        </Text>

        {diagnoses.length === 0 && <Text style={s.h2}>No diagnosis was run on this call.</Text>}
        {diagnoses.map((d, i) => (
          <View key={d.id}>
            <Text style={s.h2}>
              {diagnoses.length > 1 ? `Diagnosis ${i + 1}` : 'Diagnosis'}: {d.finding?.title ?? d.status}
            </Text>
            <Text style={s.muted}>
              {d.treeTitle}, version {d.treeVersion} · by {d.startedBy ?? '—'}
              {d.startedByRole ? ` (${d.startedByRole})` : ''} · started {fmt(d.startedAt, tz)}
              {d.signedOff ? ` · signed off by ${d.signedOff.by}${d.signedOff.at ? `, ${fmt(d.signedOff.at, tz)}` : ''}` : ''}
            </Text>
            {d.findingDetail && (
              <View style={s.finding} wrap={false}>
                <Text style={s.bold}>◆ Finding: {d.findingDetail.title}</Text>
                <Text>{d.findingDetail.explanation}</Text>
                <Text>
                  <Text style={s.bold}>Remedy: </Text>
                  {d.findingDetail.remedy}
                </Text>
                {d.findingDetail.parts.length > 0 && (
                  <Text>
                    <Text style={s.bold}>Parts: </Text>
                    {d.findingDetail.parts.join(', ')}
                  </Text>
                )}
              </View>
            )}
            {d.contradictions.map((c, k) => (
              <Text key={k}>
                ⚠ {c.reason}: {c.value} recorded at “{d.steps.find((x) => x.stepId === c.stepId)?.stepTitle ?? c.stepId}”
              </Text>
            ))}
            {d.steps.map((step) => (
              <View key={step.id} style={s.step} wrap={false}>
                <View style={s.stepHead}>
                  <Text style={[s.bold, { flex: 1 }]}>
                    {step.procedure ? PROCEDURE[step.procedure] : ''}
                    {step.stepTitle}
                  </Text>
                  <Text style={s.muted}>{fmt(step.at, tz)}</Text>
                </View>
                {step.points && (
                  <View style={{ flexDirection: 'row', flexWrap: 'wrap' }}>
                    <Text style={[s.mono, s.muted]}>{step.points[0]}</Text>
                    <Text style={s.muted}> ↔ </Text>
                    <Text style={[s.mono, s.muted]}>{step.points[1]}</Text>
                  </View>
                )}
                {step.value !== null || step.overRange ? (
                  <Text>
                    <Text style={[s.mono, s.bold]}>{shownValue(step)}</Text>
                    {`  ${verdictText(step.verdict, step.band)}`}
                  </Text>
                ) : (
                  <Text>{stepAnswer(step)}</Text>
                )}
                {step.procedure && step.checklist.length > 0 && first.has(step.id) && (
                  <Text style={s.muted}>{step.checklist.map((c) => `• ${c}`).join('\n')}</Text>
                )}
                {step.procedure && step.checklist.length > 0 && !first.has(step.id) && <Text style={s.muted}>Checklist as above.</Text>}
              </View>
            ))}
          </View>
        ))}

        <View wrap={false}>
          <Text style={s.h2}>Repair and verification</Text>
          {call.repairNotes ? (
            <Text>{call.repairNotes}</Text>
          ) : diagnoses.some((d) => d.status === 'verified') ? (
            <Text>
              Repaired, power and gas restored, and verified in the visit: the repair, the reading after it and the checks are on the path
              above.
            </Text>
          ) : (
            <Text style={s.muted}>No repair recorded.</Text>
          )}
          {v && (
            <Text>
              Heat cycles run: {v.cycles} · flame signal after repair: {v.flameSignal?.text ?? '—'}
            </Text>
          )}
          {v?.checks.map((c) => (
            <Text key={c.text}>
              {c.done ? '✓ Done' : '✗ Not done'}: {c.text}
            </Text>
          ))}
          {v?.notes && <Text>{v.notes}</Text>}
        </View>

        <Photos photos={photos} />

        {cautions.length > 0 && (
          <View>
            <Text style={s.h2}>Cautions observed</Text>
            <Cautions cautions={cautions} />
          </View>
        )}

        {events.length > 0 && (
          <View wrap={false}>
            <Text style={s.h2}>Who did what</Text>
            {events.map((e) => (
              <Text key={e.id}>
                {fmt(e.at, tz)}: {e.actorName ?? 'Someone'} {EVENT_VERBS[e.kind]}
                {e.kind === 'reassigned' ? ` to ${e.toName ?? 'someone no longer with the company'}` : ''}
                {e.note ? ` — “${e.note}”` : ''}
              </Text>
            ))}
          </View>
        )}

        <View style={s.footer} wrap={false}>
          <Text style={s.bold}>{REPORT_DEFERRAL}</Text>
        </View>
      </View>
    </Page>
  );
}

const EVENT_VERBS: Record<string, string> = {
  closed: 'closed the call',
  referred: 'referred the call',
  reopened: 'reopened the call',
  reassigned: 'reassigned the call',
  signed_off: 'signed off a finding',
};

export function ReportDocument({
  report,
  version,
  photos = [],
}: {
  report: CallReportOut;
  version: ReportVersion;
  photos?: ReportPhoto[];
}) {
  registerFonts();
  return (
    <Document
      title={`Service report — ${report.site.name}`}
      author={report.company.name}
      subject={version === 'office' ? 'Office record' : 'Customer copy'}
      creator="Proving Ground"
      producer="Proving Ground"
    >
      {version === 'office' ? <OfficePages report={report} photos={photos} /> : <CustomerPages report={report} photos={photos} />}
    </Document>
  );
}
