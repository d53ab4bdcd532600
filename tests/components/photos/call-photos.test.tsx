import { render, screen, within } from '@testing-library/react';
import { SWRConfig } from 'swr';
import { CallPhotos } from '@/components/photos/call-photos';
import type { AttachmentOut } from '@/lib/validations/attachments';

// The call page's Photos section: every photo of the call under what it is of.

const photo = (over: Partial<AttachmentOut> & { id: string }): AttachmentOut => ({
  url: `/api/attachments/${over.id}`,
  thumbnailUrl: `/api/attachments/${over.id}?size=thumb`,
  answerId: null,
  answerClientId: null,
  findingId: null,
  width: 2048,
  height: 1536,
  size: 200_000,
  ownerName: 'Dale Ferris',
  createdAt: new Date('2026-12-01T10:00:00Z'),
  ...over,
});

const list = {
  editable: true,
  photos: [
    photo({ id: 'p1', answerId: 'ans-flame', answerClientId: 'c-flame' }),
    photo({ id: 'p2', answerId: 'ans-flame', answerClientId: 'c-flame' }),
    photo({ id: 'p3' }),
    photo({ id: 'p4', findingId: 'diag-1' }),
    photo({ id: 'p5', answerId: 'ans-gone' }),
  ],
};

beforeEach(() => {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => Response.json(list)),
  );
});
afterEach(() => vi.unstubAllGlobals());

function renderPhotos() {
  render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
      <CallPhotos
        callId="call-1"
        initial={list}
        answers={[
          { id: 'ans-flame', label: 'Flame signal (DC microamps): 0.6 µA' },
          { id: 'ans-line', label: 'Line voltage at the unit: 120 VAC' },
        ]}
        findings={[{ id: 'diag-1', label: 'Dirty or oxidized flame rod' }]}
      />
    </SWRConfig>,
  );
}

const group = (name: string) => screen.getByRole('group', { name: `Photos: ${name}` });

describe('CallPhotos', () => {
  it('groups the call’s photos by what they are of, and counts them', async () => {
    renderPhotos();
    expect(screen.getByRole('heading', { name: 'Photos (5)' })).toBeInTheDocument();
    expect(within(group('the call')).getAllByTestId('photo')).toHaveLength(1);
    expect(within(group('the finding “Dirty or oxidized flame rod”')).getAllByTestId('photo')).toHaveLength(1);
    expect(within(group('Flame signal (DC microamps): 0.6 µA')).getAllByTestId('photo')).toHaveLength(2);
    // A reading without photos has no group here (its photos are added from the wizard).
    expect(screen.queryByRole('group', { name: 'Photos: Line voltage at the unit: 120 VAC' })).toBeNull();
    // A photo of an answer the page no longer lists is shown, not dropped.
    expect(within(group('an earlier answer')).getAllByTestId('photo')).toHaveLength(1);
    expect(screen.getAllByTestId('photo')).toHaveLength(5);
  });

  it('without photos: the call and its finding each say so and offer to add one', () => {
    render(
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <CallPhotos callId="call-2" initial={{ editable: true, photos: [] }} answers={[]} findings={[{ id: 'd', label: 'Open limit' }]} />
      </SWRConfig>,
    );
    expect(screen.getByRole('heading', { name: 'Photos' })).toBeInTheDocument();
    expect(screen.getAllByText('No photos yet.')).toHaveLength(2);
    expect(screen.getAllByRole('button', { name: /Take photo/ })).toHaveLength(2);
  });
});
