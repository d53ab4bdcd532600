import type { Metadata } from 'next';
import Link from 'next/link';
import { assignCallAction, closeCallAction, reopenCallAction, signOffAction, startDiagnosisAction } from '@/app/(app)/calls/actions';
import { resendMailAction } from '@/app/(app)/calls/[id]/report/actions';
import { CallCaution } from '@/components/calls/call-caution';
import { CallRecord } from '@/components/calls/call-record';
import {
  CloseCallControls,
  ReassignCallControl,
  ReopenCallControls,
  SignOffButton,
  StartDiagnosisButton,
} from '@/components/calls/call-controls';
import { CallStatusBadge } from '@/components/calls/call-status';
import { DIAGNOSIS_LABELS } from '@/components/calls/format';
import { ReadingsTable } from '@/components/calls/readings-table';
import { UnitCard } from '@/components/calls/unit-card';
import { CallEmailStatus } from '@/components/mail/call-email-status';
import { CallPhotos } from '@/components/photos/call-photos';
import { BackLink } from '@/components/ui/back-link';
import { readingText } from '@/components/wizard/path-so-far';
import { Time } from '@/components/ui/time-zone';
import { may } from '@/lib/policy';
import { ROLE_LABELS, type Role } from '@/lib/roles';
import { listCallAttachments } from '@/lib/server/attachments';
import { getCallPage, getCallReport, listCallAssignees } from '@/lib/server/calls';
import { orNotFound, pageScope } from '@/lib/server/operation';
import { previewReportEmail } from '@/lib/server/outbox';
import { callReportSchema } from '@/lib/validations/api';
import { attachmentListSchema } from '@/lib/validations/attachments';
import { reportEmailPreviewSchema } from '@/lib/validations/mail';

export const metadata: Metadata = { title: 'Service call' };
export const dynamic = 'force-dynamic';

const DIAGNOSIS_ICONS: Record<string, string> = { in_progress: '◐', found: '◆', verified: '✓', escalated: '↗' };

export default async function CallPage({ params }: { params: Promise<{ id: string }> }) {
  const { user, scope } = await pageScope('calls.get');
  const { id } = await params;
  const page = await orNotFound(getCallPage({ scope, id }));
  const { call, unit, site, diagnoses, readings, defaultTree, closed, events } = page;
  const canSignOff = may(user.role, 'diagnoses.signOff');
  const canClose = may(user.role, 'calls.close');
  const canReopen = may(user.role, 'calls.reopen');
  const canAssign = may(user.role, 'calls.assign') && !closed;
  const assignees = canAssign ? await listCallAssignees({ scope }) : [];
  const inProgress = diagnoses.find((d) => d.status === 'in_progress');
  const [photos, report, emailPreview] = await Promise.all([
    listCallAttachments({ scope, callId: id }).then((l) => attachmentListSchema.parse(l)),
    getCallReport({ scope, id }).then((r) => callReportSchema.parse(r)),
    may(user.role, 'reports.emailPreview')
      ? pageScope('reports.emailPreview').then(async ({ scope: s }) =>
          reportEmailPreviewSchema.parse(await previewReportEmail({ scope: s, id })),
        )
      : null,
  ]);
  // What each photo is of, in words: the step and its answer, or the finding.
  const answerLabels = report.diagnoses.flatMap((d) =>
    d.steps.map((st) => {
      const answer =
        st.kind === 'measure'
          ? readingText({
              quantity: st.quantity ?? undefined,
              text: st.text ?? undefined,
              unit: st.unit ?? undefined,
              overRange: st.overRange ? true : undefined,
            })
          : (st.choiceLabel ?? (st.confirmed ? 'done' : null));
      return { id: st.id, label: answer ? `${st.stepTitle}: ${answer}` : st.stepTitle };
    }),
  );
  const findingLabels = diagnoses.filter((d) => d.finding).map((d) => ({ id: d.id, label: d.finding!.title }));
  const startReason = closed
    ? 'This call is closed: open a new call to diagnose again.'
    : !defaultTree
      ? 'No published fault tree yet: a lead publishes one first.'
      : null;

  return (
    <div className="space-y-6 pb-8">
      <div className="space-y-2">
        <BackLink href="/calls">Service calls</BackLink>
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div>
            <h1 className="page-title">
              {site.name} · {unit.label}
            </h1>
            <p className="text-muted">
              Opened <Time value={call.openedAt} />
              {call.closedAt && (
                <>
                  {` · ${call.status === 'referred' ? 'referred' : 'closed'} `}
                  <Time value={call.closedAt} />
                  {call.closedByName ? ` by ${call.closedByName}` : ''}
                </>
              )}
            </p>
          </div>
          <CallStatusBadge status={call.status} />
        </div>
      </div>

      <section aria-labelledby="complaint-heading" className="card grid gap-4 sm:grid-cols-[2fr_1fr]">
        <div>
          <h2 id="complaint-heading" className="label">
            Complaint
          </h2>
          <p className="text-lg">{call.complaint}</p>
        </div>
        <div>
          <h2 className="label">Technician</h2>
          <p className="text-lg">
            {call.technicianName ?? 'Not assigned'}
            {call.technicianRole && <span className="block text-base text-muted">{ROLE_LABELS[call.technicianRole as Role]}</span>}
          </p>
          {canAssign && (
            <div className="mt-3">
              <ReassignCallControl callId={call.id} currentId={call.technicianId} assignees={assignees} assignCall={assignCallAction} />
            </div>
          )}
        </div>
      </section>

      <CallCaution />

      <UnitCard unit={unit} linkToUnit={may(user.role, 'units.get')} />

      <section aria-labelledby="diagnoses-heading" className="card space-y-4">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div>
            <h2 id="diagnoses-heading" className="text-xl font-bold">
              Diagnoses
            </h2>
            {defaultTree && (
              <p className="text-sm text-muted">
                New diagnoses follow “{defaultTree.title}”, version {defaultTree.version}.
              </p>
            )}
          </div>
          <StartDiagnosisButton
            callId={call.id}
            treeVersionId={defaultTree?.id ?? null}
            disabledReason={startReason}
            startDiagnosis={startDiagnosisAction}
            secondary={Boolean(inProgress) || diagnoses.length > 0}
          />
        </div>
        {diagnoses.length === 0 ? (
          <p className="text-muted">No diagnosis yet. Start one at the unit: it walks you through the checks one step at a time.</p>
        ) : (
          <ol className="space-y-3">
            {diagnoses.map((d, i) => (
              <li key={d.id} className="rounded-lg border border-line bg-surface p-4">
                <div className="flex flex-wrap items-start justify-between gap-3">
                  <div className="space-y-1">
                    <p className="text-sm text-muted">
                      Diagnosis {i + 1} · {d.treeTitle}, v{d.treeVersion}
                    </p>
                    <p className="text-lg font-bold">
                      {d.finding
                        ? d.finding.title
                        : d.status === 'in_progress'
                          ? `In progress, ${d.answers} ${d.answers === 1 ? 'answer' : 'answers'} so far`
                          : 'Escalated'}
                    </p>
                    <p className="text-sm">
                      <span className="inline-flex items-center gap-1 font-semibold">
                        <span aria-hidden className="font-mono">
                          {DIAGNOSIS_ICONS[d.status]}
                        </span>
                        {DIAGNOSIS_LABELS[d.status]}
                      </span>
                      {' · '}
                      {d.startedBy ?? 'Someone'}
                      {d.startedByRole ? ` (${d.startedByRole})` : ''}, started <Time value={d.startedAt} />
                    </p>
                    {d.escalation && (
                      <p className="text-base">
                        <span className="font-semibold">Note for the leads:</span> “{d.escalation.note}”
                      </p>
                    )}
                    {d.startedByRole === 'apprentice' && (d.status === 'found' || d.status === 'verified') && (
                      <p className="text-sm font-semibold">
                        {d.signedOff ? (
                          <span>
                            <span aria-hidden>✓ </span>Signed off by {d.signedOff.by}
                            {d.signedOff.at && (
                              <>
                                , <Time value={d.signedOff.at} />
                              </>
                            )}
                          </span>
                        ) : (
                          <span>
                            <span aria-hidden>⚠ </span>Needs a technician’s or a lead’s sign-off before the call can be closed
                          </span>
                        )}
                      </p>
                    )}
                  </div>
                  <div className="flex flex-wrap gap-2">
                    <Link
                      href={`/calls/${call.id}/diagnoses/${d.id}`}
                      className={(d.status === 'in_progress' || d.status === 'found') && !closed ? 'btn-primary' : 'btn-secondary'}
                    >
                      {(d.status === 'in_progress' || d.status === 'found') && !closed ? 'Continue' : 'Open'}
                      <span className="sr-only"> diagnosis {i + 1}</span>
                    </Link>
                  </div>
                </div>
                {d.needsSignOff && canSignOff && d.startedById !== user.id && !closed && (
                  <div className="mt-3">
                    <SignOffButton callId={call.id} diagnosisId={d.id} findingTitle={d.finding?.title} signOff={signOffAction} />
                  </div>
                )}
              </li>
            ))}
          </ol>
        )}
      </section>

      <section aria-labelledby="readings-heading" className="card space-y-3">
        <h2 id="readings-heading" className="text-xl font-bold">
          Readings
        </h2>
        <ReadingsTable readings={readings} caption="Readings taken on this call" />
      </section>

      <section aria-labelledby="repair-heading" className="card space-y-3">
        <h2 id="repair-heading" className="text-xl font-bold">
          Repair and verification
        </h2>
        {diagnoses.some((d) => d.status === 'verified') ? (
          <ul className="space-y-3">
            {diagnoses
              .filter((d) => d.status === 'verified' && d.finding)
              .map((d) => (
                <li key={d.id} className="space-y-1">
                  <p className="font-semibold">
                    <span aria-hidden>✓ </span>
                    {d.finding!.title}: repaired, power and gas restored, checks ticked
                    {d.finishedAt && (
                      <>
                        {' '}
                        (<Time value={d.finishedAt} />)
                      </>
                    )}
                  </p>
                  <ul className="list-disc pl-6 text-base">
                    {d.finding!.verification.map((v) => (
                      <li key={v}>{v}</li>
                    ))}
                  </ul>
                </li>
              ))}
          </ul>
        ) : (
          <p className="text-muted">
            After the finding, the wizard goes on with the repair, restoring power and gas, and the checks; the readings after the repair
            appear with the others above.
          </p>
        )}
        {call.repairNotes && (
          <div className="space-y-1">
            <p className="font-semibold">Repair notes recorded</p>
            <p className="whitespace-pre-line">{call.repairNotes}</p>
          </div>
        )}
      </section>

      <CallPhotos callId={call.id} initial={photos} answers={answerLabels} findings={findingLabels} />

      <section aria-labelledby="finish-heading" className="card space-y-3">
        <h2 id="finish-heading" className="text-xl font-bold">
          {closed ? 'Report' : 'Finish the call'}
        </h2>
        {closed && (
          <p className="font-semibold" role="status">
            {call.status === 'referred' ? 'The call is referred.' : 'The call is closed.'}
          </p>
        )}
        {!closed && canClose && <CloseCallControls callId={call.id} closeCall={closeCallAction} />}
        {!closed && !canClose && <p className="text-muted">A technician reviews your finding, signs it off and closes the call.</p>}
        <div className="flex flex-wrap gap-2">
          <Link href={`/calls/${call.id}/report`} className="btn-secondary">
            Service report
          </Link>
          {closed && canReopen && <ReopenCallControls callId={call.id} reopenCall={reopenCallAction} />}
        </div>
      </section>

      {emailPreview && <CallEmailStatus callId={call.id} initial={emailPreview} resend={resendMailAction} />}

      {events.length > 0 && (
        <section aria-labelledby="record-heading" className="card space-y-3">
          <h2 id="record-heading" className="text-xl font-bold">
            Record
          </h2>
          <CallRecord events={events} />
        </section>
      )}
    </div>
  );
}
