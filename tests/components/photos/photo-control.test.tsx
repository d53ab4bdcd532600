import { act, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SWRConfig } from 'swr';
import { PhotoControl } from '@/components/photos/photo-control';
import type { AttachmentOut } from '@/lib/validations/attachments';

// The photo control against a stand-in XMLHttpRequest (the upload, driven by the test: progress,
// then the server's answer) and fetch (the call's photo list, and DELETE).

class FakeXhr {
  static all: FakeXhr[] = [];
  method = '';
  url = '';
  body: FormData | null = null;
  status = 0;
  responseText = '';
  headers: Record<string, string> = {};
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  constructor() {
    FakeXhr.all.push(this);
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(k: string, v: string) {
    this.headers[k] = v;
  }
  send(body: FormData) {
    this.body = body;
  }
  abort() {
    this.onabort?.();
  }
  progress(loaded: number, total: number) {
    act(() => this.upload.onprogress?.({ lengthComputable: true, loaded, total }));
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    act(() => this.onload?.());
  }
  fail() {
    act(() => this.onerror?.());
  }
}

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

let listed: { photos: AttachmentOut[]; editable: boolean };
const fetchMock = vi.fn<typeof fetch>();

beforeEach(() => {
  FakeXhr.all = [];
  listed = { photos: [], editable: true };
  fetchMock.mockReset();
  fetchMock.mockImplementation(async (input, init) => {
    const url = String(input);
    if (init?.method === 'DELETE') {
      const id = url.split('/').pop()!;
      listed.photos = listed.photos.filter((p) => p.id !== id);
      return Response.json({ id, removed: true });
    }
    return Response.json(listed);
  });
  vi.stubGlobal('fetch', fetchMock);
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  URL.createObjectURL = vi.fn(() => 'blob:preview');
  URL.revokeObjectURL = vi.fn();
});

afterEach(() => vi.unstubAllGlobals());

function renderControl(props: Partial<Parameters<typeof PhotoControl>[0]> = {}) {
  // Each test its own call (and so its own SWR key): the upload queue lives outside the component, as on a real page.
  const callId = crypto.randomUUID();
  render(
    <SWRConfig value={{ dedupingInterval: 0 }}>
      <PhotoControl callId={callId} subject="Flame signal" {...props} />
    </SWRConfig>,
  );
  return callId;
}

const jpeg = (name: string, size = 1000) => new File([new Uint8Array(size).fill(0xff)], name, { type: 'image/jpeg' });

describe('PhotoControl', () => {
  it('sends several photos at once, each with its own progress bar, and shows them as thumbnails once stored', async () => {
    const user = userEvent.setup();
    const callId = renderControl({ answerId: 'client-1' });
    await screen.findByRole('button', { name: /Choose photos/ });
    await user.upload(screen.getByTestId('photo-file-input'), [jpeg('rod.jpg'), jpeg('meter.jpg')]);

    expect(FakeXhr.all).toHaveLength(2);
    for (const xhr of FakeXhr.all) {
      expect(xhr.method).toBe('POST');
      expect(xhr.url).toBe(`/api/calls/${callId}/attachments`);
      expect(xhr.body!.get('answerId')).toBe('client-1');
      expect(xhr.body!.get('file')).toBeInstanceOf(File);
    }
    const bars = screen.getAllByRole('progressbar');
    expect(bars).toHaveLength(2);
    FakeXhr.all[0].progress(500, 1000);
    expect(screen.getByRole('progressbar', { name: 'Sending rod.jpg' })).toHaveAttribute('aria-valuenow', '50');
    expect(screen.getByRole('progressbar', { name: 'Sending meter.jpg' })).toHaveAttribute('aria-valuenow', '0');

    listed.photos = [photo({ id: 'a1', answerId: 'server-1', answerClientId: 'client-1' })];
    FakeXhr.all[0].answer(201, { id: 'a1', url: '/api/attachments/a1', thumbnailUrl: '/api/attachments/a1?size=thumb' });
    expect(await screen.findByRole('img', { name: 'Photo 1 of Flame signal' })).toHaveAttribute('src', '/api/attachments/a1?size=thumb');
    await waitFor(() => expect(screen.getAllByRole('progressbar')).toHaveLength(1));

    listed.photos = [...listed.photos, photo({ id: 'a2', answerId: 'server-1', answerClientId: 'client-1' })];
    FakeXhr.all[1].answer(201, { id: 'a2', url: '/api/attachments/a2', thumbnailUrl: '/api/attachments/a2?size=thumb' });
    expect(await screen.findByRole('img', { name: 'Photo 2 of Flame signal' })).toBeInTheDocument();
    await waitFor(() => expect(screen.queryAllByRole('progressbar')).toHaveLength(0));
  });

  it('a refused photo stays listed with the server’s reason in words; no retry for a file that is not an image', async () => {
    const user = userEvent.setup();
    renderControl();
    await user.upload(await screen.findByTestId('photo-file-input'), jpeg('notes.jpg'));
    FakeXhr.all[0].answer(415, {
      error: { code: 'unsupported_media_type', message: 'That file is not a photo: send a JPEG, PNG, WebP or AVIF image.' },
    });
    const item = await screen.findByTestId('photo-upload');
    expect(item).toHaveAttribute('data-status', 'failed');
    expect(within(item).getByRole('alert')).toHaveTextContent('That file is not a photo: send a JPEG, PNG, WebP or AVIF image.');
    expect(within(item).getByRole('alert')).toHaveTextContent('notes.jpg');
    expect(within(item).queryByRole('button', { name: /Try again/ })).toBeNull();
    expect(screen.getByText(/1 photo was not stored/)).toBeInTheDocument();
    // Only the user lets it go.
    await user.click(within(item).getByRole('button', { name: /remove from the list/ }));
    expect(screen.queryByTestId('photo-upload')).toBeNull();
  });

  it('a dropped connection offers a retry, which sends the same file again', async () => {
    const user = userEvent.setup();
    renderControl();
    const file = jpeg('burner.jpg');
    await user.upload(await screen.findByTestId('photo-file-input'), file);
    FakeXhr.all[0].fail();
    const item = await screen.findByTestId('photo-upload');
    expect(within(item).getByRole('alert')).toHaveTextContent('No connection to the server: the photo was not sent.');
    await user.click(within(item).getByRole('button', { name: /Try again/ }));
    expect(FakeXhr.all).toHaveLength(2);
    const resent = FakeXhr.all[1].body!.get('file') as File;
    expect([resent.name, resent.size]).toEqual([file.name, file.size]);
    listed.photos = [photo({ id: 'b1' })];
    FakeXhr.all[1].answer(201, { id: 'b1', url: '/api/attachments/b1', thumbnailUrl: '/api/attachments/b1?size=thumb' });
    expect(await screen.findByRole('img', { name: 'Photo 1 of Flame signal' })).toBeInTheDocument();
    await waitFor(() => expect(screen.queryByTestId('photo-upload')).toBeNull());
  });

  it('a 413 from the server shows its message; a file over 15 MB is refused before anything is sent', async () => {
    const user = userEvent.setup();
    renderControl();
    const input = await screen.findByTestId('photo-file-input');
    await user.upload(input, jpeg('big.jpg'));
    FakeXhr.all[0].answer(413, { error: { code: 'payload_too_large', message: 'That photo is too large: at most 15 MB.' } });
    expect(await screen.findByText('That photo is too large: at most 15 MB.', { exact: false })).toBeInTheDocument();

    const huge = jpeg('huge.jpg', 10);
    Object.defineProperty(huge, 'size', { value: 16 * 1024 * 1024 });
    await user.upload(input, huge);
    expect(FakeXhr.all).toHaveLength(1);
    expect(await screen.findByText(/This file is 16\.0 MB: a photo may be at most 15 MB/)).toBeInTheDocument();
  });

  it('removes a photo only after the confirmation, with DELETE', async () => {
    const user = userEvent.setup();
    listed.photos = [photo({ id: 'c1' }), photo({ id: 'c2' })];
    renderControl();
    await screen.findByRole('img', { name: 'Photo 2 of Flame signal' });
    await user.click(screen.getByRole('button', { name: /^Remove\s*photo 1 of Flame signal$/ }));
    const dialog = screen.getByRole('dialog', { name: 'Remove this photo?' });
    await user.click(within(dialog).getByRole('button', { name: 'Cancel' }));
    expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'DELETE')).toHaveLength(0);

    await user.click(screen.getByRole('button', { name: /^Remove\s*photo 1 of Flame signal$/ }));
    await user.click(within(screen.getByRole('dialog', { name: 'Remove this photo?' })).getByRole('button', { name: 'Remove photo' }));
    await waitFor(() => expect(screen.queryAllByTestId('photo')).toHaveLength(1));
    const deletes = fetchMock.mock.calls.filter(([, init]) => init?.method === 'DELETE');
    expect(deletes.map(([url]) => String(url))).toEqual(['/api/attachments/c1']);
  });

  it('shows only its own target’s photos, and on a closed call neither adds nor removes', async () => {
    listed = {
      editable: false,
      photos: [
        photo({ id: 'd1', answerId: 'server-9', answerClientId: 'client-9' }),
        photo({ id: 'd2' }),
        photo({ id: 'd3', findingId: 'diag-1' }),
      ],
    };
    renderControl({ answerId: 'client-9' });
    expect(await screen.findByRole('img', { name: 'Photo 1 of Flame signal' })).toHaveAttribute('src', '/api/attachments/d1?size=thumb');
    expect(screen.getAllByTestId('photo')).toHaveLength(1);
    expect(screen.queryByRole('button', { name: /Take photo|Choose photos|Remove/ })).toBeNull();
  });

  it('takes photos with the camera: the camera input asks for the rear camera', async () => {
    renderControl();
    const camera = await screen.findByTestId('photo-camera-input');
    expect(camera).toHaveAttribute('capture', 'environment');
    expect(camera).toHaveAttribute('accept', 'image/*');
    expect(camera).toHaveAttribute('multiple');
  });
});
