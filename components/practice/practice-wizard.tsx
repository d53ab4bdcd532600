'use client';

// A practice diagnosis: the real wizard walking the attempt's tree version beside the attempt's
// bench. A measure step with a probe is answered by measuring on the schematic (the reading at the
// step's points fills it), an inspect step that observes by a look on the bench (the result
// preselects its choice); a step without either keeps the keypad and the choices. The answers go to
// the practice operations, which check each against what the bench really gave and score the
// attempt when the walk reaches a finding; this page then shows the score.
import { useRouter } from 'next/navigation';
import { useCallback, useMemo, useRef, useState } from 'react';
import { httpBenchClient, type BenchClient } from '@/components/bench/bench-client';
import { BenchScreen, resultWords, type BenchHandle, type BenchTaken } from '@/components/bench/bench-screen';
import { Wizard, type StepSources, type WizardActions } from '@/components/wizard/wizard';
import { formatClock } from '@/lib/practice/scoring';
import { observeText, probeText, readingAnswers } from '@/lib/practice/walk';
import { CANONICAL_UNITS, type TreeVersion, type UnitFacts } from '@/lib/trees/schema';
import type { UnitSystem } from '@/lib/units';
import type { ActionResult, DiagnosisViewOut } from '@/lib/validations/api';
import type { PracticeAnswerResult, UnitProfile } from '@/lib/validations/practice';

export interface PracticeWizardProps {
  attemptId: string;
  unit: UnitProfile;
  facts: UnitFacts;
  version: TreeVersion;
  initialView: DiagnosisViewOut;
  displayUnits: UnitSystem;
  /** The practice operations' server actions (components do not import from app/). */
  answer?: (input: unknown) => Promise<ActionResult<PracticeAnswerResult>>;
  undo?: (input: unknown) => Promise<ActionResult<DiagnosisViewOut>>;
  /** The wizard's actions instead of the practice operations (a lead proving a tree: nothing stored). */
  actions?: WizardActions;
  /** A bench other than the attempt's over HTTP (a lead's own session; tests). */
  client?: BenchClient;
}

const NO_ESCALATION = 'A practice walk is not sent to the leads: if no choice fits what the bench shows, tell your trainer.';

export function PracticeWizard({
  attemptId,
  unit,
  facts,
  version,
  initialView,
  displayUnits,
  answer,
  undo,
  actions: given,
  client,
}: PracticeWizardProps) {
  const router = useRouter();
  const bench = useMemo(
    () => client ?? httpBenchClient(`/api/practice/attempts/${encodeURIComponent(attemptId)}/bench`, { gauges: true }),
    [client, attemptId],
  );
  const handle = useRef<BenchHandle>(null);
  const [taken, setTaken] = useState<BenchTaken[]>([]);
  const [scored, setScored] = useState(false);
  const onTaken = useCallback((t: BenchTaken) => setTaken((all) => [...all, t]), []);

  const actions = useMemo<WizardActions>(
    () =>
      given ?? {
        submitAnswer: async (input) => {
          const { answer: a } = input as { answer: unknown };
          if (!answer) return { ok: false, code: 'bad_request', message: 'Nowhere to save this answer.' };
          const result = await answer({ id: attemptId, answer: a });
          if (result.ok && result.data.scored) {
            setScored(true);
            router.refresh();
          }
          // The attempt moved on elsewhere (finished in another tab): show the page as it now stands.
          if (!result.ok && result.code === 'conflict') {
            router.refresh();
            return { ...result, code: 'bad_request' as const };
          }
          return result;
        },
        undoAnswer: async (input) => {
          const { last } = input as { last?: string };
          if (!undo) return { ok: false, code: 'bad_request', message: 'Nothing to undo here.' };
          return undo({ id: attemptId, ...(last ? { last } : {}) });
        },
        escalate: async () => ({ ok: false, code: 'bad_request', message: NO_ESCALATION }),
      },
    [given, answer, undo, attemptId, router],
  );

  const sources = useMemo<StepSources>(
    () => ({
      reading: (step) => {
        if (!step.probe) return null;
        // A bench that reads no gauges (a plain bench session): the keypad, as without a probe.
        if ('gauge' in step.probe && !bench.gauge) return null;
        const latest = taken.findLast((t) => t.kind === 'measure' && readingAnswers(step, t.request));
        const unitSymbol = CANONICAL_UNITS[step.quantity];
        return {
          hint: probeText(step),
          reading:
            latest && latest.kind === 'measure'
              ? {
                  key: String(latest.n),
                  text: latest.value === null ? 'OL' : String(latest.value),
                  unit: unitSymbol,
                  label: `${latest.value === null ? 'OL' : latest.value} ${unitSymbol} at ${formatClock(latest.time)}`,
                }
              : null,
        };
      },
      observe: (step) => {
        if (!step.observe) return null;
        const looks = [step.observe, ...(step.observeMore ?? [])];
        return {
          label: observeText(step.observe),
          run: async () => {
            const seen: string[] = [];
            for (const look of looks) {
              if (!handle.current) throw new Error('The bench is still opening.');
              const reply = await handle.current.observe(look.what);
              seen.push(`${look.what}: ${resultWords(reply.result)}`);
              const choice = look.choices[reply.result];
              if (choice !== undefined) {
                const label = step.choices.find((c) => c.value === choice)?.label ?? choice;
                return { choice, text: `The bench shows ${seen.join('; ')} — “${label}” is chosen.` };
              }
            }
            return { choice: null, text: `The bench shows ${seen.join('; ')}: choose what fits.` };
          },
        };
      },
    }),
    [taken, bench],
  );

  if (scored) {
    return (
      <p role="status" className="card text-lg" data-testid="attempt-scoring">
        The walk reached its finding: the attempt is scored. Opening the score…
      </p>
    );
  }

  return (
    <div className="grid gap-6 2xl:grid-cols-2 2xl:items-start">
      <section id="practice-step" aria-label="The diagnosis" data-testid="practice-wizard" className="min-w-0 scroll-mt-4">
        <Wizard
          actions={actions}
          diagnosisId={attemptId}
          callId={`practice-${attemptId}`}
          version={version}
          initialView={initialView}
          displayUnits={displayUnits}
          transformerVa={null}
          viewerRole="apprentice"
          unit={facts}
          sources={sources}
          practice
        />
      </section>
      {/* min-w-0: a grid item would otherwise widen to the schematic's own width on a phone. */}
      <section id="practice-bench" aria-label="The bench" className="min-w-0 scroll-mt-4">
        {/* Below the step on a tablet: a way back up once the reading is taken (it fills the step by itself). */}
        <p className="mb-3 2xl:hidden">
          <a href="#practice-step" className="inline-flex min-h-12 items-center font-semibold underline underline-offset-4">
            ↑ Back to the step
          </a>
        </p>
        <BenchScreen client={bench} unit={unit} onTaken={onTaken} handle={handle} scored={!given} />
      </section>
    </div>
  );
}
