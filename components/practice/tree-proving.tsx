'use client';

// A lead proving the company's tree on a bench session of their own: the real wizard walks the
// published version with the bench answering its steps as in practice, and nothing is stored of
// the walk (the dry run's actions); the fault on the bench is shown, so the finding reached can be
// held against it.
import { useMemo, useState } from 'react';
import { httpBenchClient } from '@/components/bench/bench-client';
import { PracticeWizard } from '@/components/practice/practice-wizard';
import { dryRunActions } from '@/components/trees/dry-run';
import { INITIAL_ENERGY } from '@/machines/diagnosis-machine';
import type { TreeVersion, UnitFacts } from '@/lib/trees/schema';
import type { UnitSystem } from '@/lib/units';
import type { DiagnosisViewOut } from '@/lib/validations/api';
import type { UnitProfile } from '@/lib/validations/practice';

interface Props {
  sessionId: string;
  unit: UnitProfile;
  version: TreeVersion;
  title: string;
  displayUnits: UnitSystem;
}

function startView(version: TreeVersion, title: string, sessionId: string): DiagnosisViewOut {
  return {
    id: `proving-${sessionId}`,
    callId: `proving-${sessionId}`,
    status: 'in_progress',
    treeVersionId: version.id,
    tree: { title, version: version.version },
    startedBy: { id: null, name: null, role: null },
    signedOff: null,
    energy: INITIAL_ENERGY.electric === 'on' ? 'energized' : 'locked-out',
    gas: INITIAL_ENERGY.gas === 'off' ? 'off' : 'on',
    phase: 'walk',
    escalation: null,
    path: [],
    current: null,
    finding: null,
    contradictions: [],
    callStatus: 'diagnosing',
  };
}

export function TreeProving({ sessionId, unit, version, title, displayUnits }: Props) {
  const [run, setRun] = useState(0);
  // A fresh walk for each run; the bench keeps its state (its events are the session's).
  const actions = useMemo(() => dryRunActions(version), [version, run]); // eslint-disable-line react-hooks/exhaustive-deps
  const client = useMemo(() => httpBenchClient(`/api/bench/sessions/${encodeURIComponent(sessionId)}`, { gauges: true }), [sessionId]);
  const facts: UnitFacts = { ignition: unit.ignition, fuel: unit.fuel, controlSupply: unit.controlSupply, draft: unit.draft };
  return (
    <div className="space-y-4">
      <button type="button" className="btn-secondary" onClick={() => setRun((r) => r + 1)}>
        Walk the tree again
      </button>
      <PracticeWizard
        key={run}
        attemptId={`${sessionId}-${run}`}
        unit={unit}
        facts={facts}
        version={version}
        initialView={startView(version, title, sessionId)}
        displayUnits={displayUnits}
        actions={actions}
        client={client}
      />
    </div>
  );
}
