import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SWRConfig } from 'swr';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { IsolationCheck } from '@/components/trees/isolation-check';

// The isolation-check screen against the route's contract (GET /api/tree-versions/{id}/isolation-check
// → [{ faultId, faultTitle, expectedFindingTags, reachedStepId, ok, reason?, unit, path }], read
// through lib/validations/isolation.ts), with fetch answering as the server would. The rows are made
// up for the screen, not the bench's results.

const steps = [
  { id: 'f-blown-fuse', title: 'Blown control fuse', kind: 'finding' },
  { id: 'f-open-limit', title: 'Open high limit', kind: 'finding' },
  { id: 'spark-observe', title: 'Watch for the spark', kind: 'inspect' },
];
const unit = { controlSupply: '24v', ignition: 'two-rod', fuel: 'natural-gas', draft: 'induced' } as const;
const TITLES: Record<string, string> = {
  'blown-fuse': 'Blown control fuse',
  'open-rollout': 'Open rollout switch',
  'no-spark': 'Control gives no spark',
};
/** A row as the route sends it. */
const row = (r: { faultId: string; expectedFindingTags: string[]; reachedStepId: string | null; ok: boolean; reason?: string }) => ({
  ...r,
  faultTitle: TITLES[r.faultId],
  unit,
  path: [{ stepId: 'line-voltage', answer: '120.3 VAC' }],
});

function answer(status: number, body: unknown) {
  return vi.fn(async () => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } }));
}

function show(stepHref = '/trees/versions/v1/edit') {
  return render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
      <IsolationCheck versionId="v1" steps={steps} stepHref={stepHref} defaultUnit={unit} />
    </SWRConfig>,
  );
}

afterEach(() => vi.unstubAllGlobals());

describe('IsolationCheck', () => {
  it('shows the matrix with the misses set apart, each reached step linking to the editor', async () => {
    const fetch = answer(200, [
      row({ faultId: 'blown-fuse', expectedFindingTags: ['fuse'], reachedStepId: 'f-blown-fuse', ok: true }),
      row({
        faultId: 'open-rollout',
        expectedFindingTags: ['rollout'],
        reachedStepId: 'f-open-limit',
        ok: false,
        reason: 'The finding "f-open-limit" lacks the tags "rollout" this fault expects.',
      }),
      row({
        faultId: 'no-spark',
        expectedFindingTags: ['spark'],
        reachedStepId: 'spark-observe',
        ok: false,
        reason: 'The bench could not answer.',
      }),
    ]);
    vi.stubGlobal('fetch', fetch);
    show();
    expect(screen.getByTestId('isolation-loading')).toHaveTextContent(/Running every fault/);
    expect(await screen.findByTestId('isolation-summary')).toHaveTextContent('2 of 3 faults not isolated');
    expect(fetch).toHaveBeenCalledWith(
      '/api/tree-versions/v1/isolation-check?controlSupply=24v&ignition=two-rod&fuel=natural-gas&draft=induced',
      expect.anything(),
    );
    expect(within(document.querySelector('[data-fault="blown-fuse"]') as HTMLElement).getByText('The walk (1 step)')).toBeInTheDocument();

    const miss = document.querySelector('[data-fault="open-rollout"]') as HTMLElement;
    expect(miss).toHaveAttribute('data-ok', 'false');
    expect(within(miss).getByText('Open rollout switch')).toBeInTheDocument();
    expect(within(miss).getByText('✗ Missed')).toBeInTheDocument();
    expect(within(miss).getByText(/lacks the tags "rollout"/)).toBeInTheDocument();
    expect(within(miss).getByRole('link', { name: /Open high limit/ })).toHaveAttribute(
      'href',
      '/trees/versions/v1/edit?step=f-open-limit',
    );
    const stopped = document.querySelector('[data-fault="no-spark"]') as HTMLElement;
    expect(within(stopped).getByText(/inspect step, not a finding/)).toBeInTheDocument();
    const hit = document.querySelector('[data-fault="blown-fuse"]') as HTMLElement;
    expect(within(hit).getByText('✓ Isolated')).toBeInTheDocument();

    await userEvent.setup().click(screen.getByLabelText('Only the misses'));
    expect(document.querySelector('[data-fault="blown-fuse"]')).toBeNull();
    expect(document.querySelectorAll('[data-ok="false"]')).toHaveLength(2);
  });

  it('says so when every fault is isolated', async () => {
    vi.stubGlobal(
      'fetch',
      answer(200, [row({ faultId: 'blown-fuse', expectedFindingTags: ['fuse'], reachedStepId: 'f-blown-fuse', ok: true })]),
    );
    show('/trees/versions/v1');
    expect(await screen.findByTestId('isolation-summary')).toHaveTextContent('Every fault isolated: 1 of 1');
    expect(screen.queryByLabelText('Only the misses')).toBeNull();
    expect(screen.getByRole('link', { name: /Blown control fuse/ })).toHaveAttribute('href', '/trees/versions/v1?step=f-blown-fuse');
  });

  it('runs again on another unit profile, with the flame-signal test for a single-rod unit', async () => {
    const user = userEvent.setup();
    const fetch = answer(200, [row({ faultId: 'blown-fuse', expectedFindingTags: ['fuse'], reachedStepId: 'f-blown-fuse', ok: true })]);
    vi.stubGlobal('fetch', fetch);
    show();
    await screen.findByTestId('isolation-summary');
    expect(screen.queryByLabelText(/flame-signal test/)).toBeNull();
    await user.selectOptions(screen.getByLabelText('Ignition'), 'single-rod');
    await user.selectOptions(screen.getByLabelText(/flame-signal test/), 'status-light');
    await screen.findByTestId('isolation-summary');
    expect(fetch).toHaveBeenLastCalledWith(
      '/api/tree-versions/v1/isolation-check?controlSupply=24v&ignition=single-rod&fuel=natural-gas&draft=induced&flameTest=status-light',
      expect.anything(),
    );
  });

  it('has an empty state', async () => {
    vi.stubGlobal('fetch', answer(200, []));
    show();
    expect(await screen.findByTestId('isolation-empty')).toHaveTextContent(/no fault for this unit profile/);
  });

  it('shows the server’s refusal and tries again on request', async () => {
    const fetch = answer(422, { error: { code: 'unprocessable', message: 'This version has problems to fix first.' } });
    vi.stubGlobal('fetch', fetch);
    show();
    const alert = await screen.findByTestId('isolation-error');
    expect(alert).toHaveTextContent('This version has problems to fix first.');
    vi.stubGlobal(
      'fetch',
      answer(200, [row({ faultId: 'blown-fuse', expectedFindingTags: ['fuse'], reachedStepId: 'f-blown-fuse', ok: true })]),
    );
    await userEvent.setup().click(within(alert).getByRole('button', { name: 'Try again' }));
    await waitFor(() => expect(screen.getByTestId('isolation-summary')).toHaveTextContent('Every fault isolated'));
  });

  it('treats an answer that is not the contract as an error, not as rows', async () => {
    vi.stubGlobal('fetch', answer(200, [{ faultId: 'blown-fuse' }]));
    show();
    expect(await screen.findByTestId('isolation-error')).toHaveTextContent(/answered in a form this page cannot read/);
  });
});
