import type { CallReportOut } from '@/lib/validations/api';

// What each version of the service report says, decided once for the web page and the PDF alike.
// The customer reads what was wrong, what was done, the readings that matter with their bands, the
// verification and the cautions about their appliance; the office keeps every step. The customer
// version leaves out the procedures (lock-out, re-energize), their checklists and the cautions
// that only concern the person at the unit, which is what made one report run to five pages.

export type ReportVersion = 'customer' | 'office';
export const REPORT_VERSIONS: readonly ReportVersion[] = ['customer', 'office'];

export const REPORT_DEFERRAL = "This report does not replace local codes, the equipment manufacturer's instructions or licensed practice.";

type Diagnosis = CallReportOut['diagnoses'][number];
type PathStep = Diagnosis['steps'][number];

export interface ReportReading {
  id: string;
  title: string;
  points: [string, string] | null;
  /** As entered, with its unit: "4.2 µA", "OL". */
  shown: string;
  band: string | null;
  verdict: string | null;
  /** Retaken after the repair (the verification), not a reading of the diagnosis. */
  afterRepair: boolean;
  at: string;
}

export interface CustomerFinding {
  diagnosisId: string;
  title: string;
  explanation: string;
  remedy: string;
  parts: string[];
  verified: boolean;
}

export interface CustomerReport {
  /** One plain sentence per diagnosis that did not end at a finding. */
  open: string[];
  findings: CustomerFinding[];
  readings: ReportReading[];
  /** The checks confirmed after the repair, in the visit or on the repair record. */
  checks: { text: string; done: boolean }[];
  cycles: number | null;
  flameSignal: string | null;
  repairNotes: string | null;
  /** The findings' own cautions: what the customer must know about their appliance. */
  cautions: CallReportOut['cautions'];
  technician: string | null;
  signedOff: { by: string | null; at: string | null }[];
}

/** A reading as the technician entered it, with the unit when the text has none. */
export function shownValue(step: Pick<PathStep, 'text' | 'value' | 'unit' | 'overRange'>): string {
  if (step.overRange) return 'OL (open)';
  const typed = step.text ?? (step.value === null ? '' : String(step.value));
  return /[a-zµΩ"]/i.test(typed) || !step.unit ? typed : `${typed} ${step.unit}`;
}

export const isAfterRepair = (stepId: string) => stepId.includes('recheck--');

/** The readings of a diagnosis's own steps (not the energy procedures'), the last one of each step. */
export function readingsOf(diagnoses: CallReportOut['diagnoses']): ReportReading[] {
  const byStep = new Map<string, ReportReading>();
  for (const d of diagnoses) {
    for (const s of d.steps) {
      if (s.procedure || s.quantity === null || (s.value === null && !s.overRange)) continue;
      byStep.set(`${d.id}|${s.stepId}`, {
        id: s.id,
        title: s.stepTitle,
        points: s.points,
        shown: shownValue(s),
        band: s.band,
        verdict: s.verdict,
        afterRepair: isAfterRepair(s.stepId),
        at: s.at,
      });
    }
  }
  return [...byStep.values()];
}

export function customerReport(report: CallReportOut): CustomerReport {
  const findings: CustomerFinding[] = [];
  const open: string[] = [];
  const cautions = new Map<string, CallReportOut['cautions'][number]>();
  const checks: { text: string; done: boolean }[] = [];
  for (const d of report.diagnoses) {
    if (d.findingDetail) {
      findings.push({
        diagnosisId: d.id,
        title: d.findingDetail.title,
        explanation: d.findingDetail.explanation,
        remedy: d.findingDetail.remedy,
        parts: d.findingDetail.parts,
        verified: d.status === 'verified',
      });
      for (const c of d.findingDetail.cautions ?? []) cautions.set(`${c.signal}|${c.text}`, c);
    } else if (d.status === 'escalated') {
      open.push('The fault was not pinned down on this visit; our senior technicians are reviewing the readings taken.');
    } else {
      open.push('The diagnosis was not finished on this visit.');
    }
    // A verified visit ended at the checks step, which confirms the finding's checks one by one.
    if (d.status === 'verified' && d.findingDetail) for (const text of d.findingDetail.verification) checks.push({ text, done: true });
  }
  const v = report.call.verification;
  for (const c of v?.checks ?? []) checks.push(c);
  const order = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE'];
  return {
    open,
    findings,
    readings: readingsOf(report.diagnoses),
    checks,
    cycles: v?.cycles ?? null,
    flameSignal: v?.flameSignal?.text ?? null,
    repairNotes: report.call.repairNotes,
    cautions: [...cautions.values()].sort((a, b) => order.indexOf(a.signal) - order.indexOf(b.signal)),
    technician: report.call.technicianName,
    signedOff: report.diagnoses.filter((d) => d.signedOff).map((d) => ({ by: d.signedOff!.by, at: d.signedOff!.at })),
  };
}

/** A procedure's checklist is printed the first time it appears; later ones say "as above". */
export function firstChecklists(diagnoses: CallReportOut['diagnoses']): Set<string> {
  const seen = new Set<string>();
  const first = new Set<string>();
  for (const d of diagnoses) {
    for (const s of d.steps) {
      if (!s.procedure || s.checklist.length === 0) continue;
      const key = s.checklist.join('\n');
      if (!seen.has(key)) {
        seen.add(key);
        first.add(s.id);
      }
    }
  }
  return first;
}

export const VERDICT_WORDS: Record<string, string> = { below: 'below', within: 'within', above: 'above' };
export const VERDICT_ICONS: Record<string, string> = { below: '▼', within: '●', above: '▲' };

/** The file name of the report's PDF: the site and the date, in plain characters. */
export function reportFileName(report: CallReportOut, version: ReportVersion): string {
  const site = report.site.name
    .normalize('NFKD')
    .replace(/[^A-Za-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40);
  const day = (report.call.closedAt ?? report.call.openedAt).slice(0, 10);
  return `${version === 'office' ? 'office-record' : 'service-report'}-${site || 'call'}-${day}.pdf`;
}
