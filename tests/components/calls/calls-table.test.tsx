import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { SWRConfig } from 'swr';
import { CallsTable } from '@/components/calls/calls-table';
import type { CallRow } from '@/lib/swr/use-calls';

const fetchMock = vi.fn<typeof fetch>();

const row = (over: Partial<CallRow>): CallRow => ({
  id: crypto.randomUUID(),
  unitId: crypto.randomUUID(),
  unitLabel: 'Basement furnace',
  siteId: crypto.randomUUID(),
  siteName: 'Oduya residence',
  siteAddress: '41 Larchmont Rise',
  complaint: 'No heat',
  status: 'open',
  technicianId: null,
  technicianName: 'Dale Ferris',
  technicianRole: 'technician',
  openedAt: '2026-11-30T10:00:00.000Z',
  closedAt: null,
  repairNotes: null,
  verification: null,
  closedByName: null,
  ...over,
});

const CALLS: CallRow[] = [
  row({
    siteName: 'Oduya residence',
    unitLabel: 'Basement furnace',
    complaint: 'Control locks out after three tries',
    status: 'open',
    openedAt: '2026-11-30T10:00:00.000Z',
    technicianName: 'Dale Ferris',
  }),
  row({
    siteName: 'Copperfield Bakery',
    unitLabel: 'Back-room furnace',
    complaint: 'Tries to light, then shuts off',
    status: 'diagnosing',
    openedAt: '2026-11-29T10:00:00.000Z',
    technicianName: 'Noor Haddad',
  }),
  row({
    siteName: 'St. Aldric Parish Hall',
    unitLabel: 'Hall furnace 2',
    complaint: 'Hall is cold',
    status: 'closed',
    openedAt: '2026-12-01T08:00:00.000Z',
    technicianName: 'Ada Brook',
  }),
];

/** The server filters by status: the mock does the same with the query SWR sends. */
function serve() {
  fetchMock.mockImplementation(async (input) => {
    const url = new URL(String(input), 'http://localhost');
    const status = url.searchParams.get('status');
    const body = status ? CALLS.filter((c) => c.status === status) : CALLS;
    return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
  });
}

function renderTable(props: Partial<React.ComponentProps<typeof CallsTable>> = {}) {
  return render(
    <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
      <CallsTable
        initialCalls={CALLS}
        technicianChoice="everyone"
        assignees={[{ id: crypto.randomUUID(), name: 'Dale Ferris' }]}
        {...props}
      />
    </SWRConfig>,
  );
}

const siteColumn = () =>
  within(screen.getByRole('table'))
    .getAllByRole('row')
    .slice(1)
    .map((r) => within(r).getAllByRole('cell')[1].textContent);

beforeEach(() => {
  vi.stubGlobal('fetch', fetchMock);
  fetchMock.mockReset();
  serve();
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('CallsTable', () => {
  it('lists the server-rendered calls newest first, each status as a word', () => {
    renderTable();
    expect(siteColumn()).toEqual([
      'St. Aldric Parish HallHall furnace 2',
      'Oduya residenceBasement furnace',
      'Copperfield BakeryBack-room furnace',
    ]);
    const table = within(screen.getByRole('table'));
    expect(table.getByText('Diagnosing')).toBeInTheDocument();
    expect(table.getByRole('columnheader', { name: /Opened/ })).toHaveAttribute('aria-sort', 'descending');
  });

  it('searches the site, the unit and the complaint', async () => {
    const user = userEvent.setup();
    renderTable();
    await user.type(screen.getByRole('searchbox', { name: 'Search' }), 'back-room');
    expect(siteColumn()).toEqual(['Copperfield BakeryBack-room furnace']);
    await user.clear(screen.getByRole('searchbox', { name: 'Search' }));
    await user.type(screen.getByRole('searchbox', { name: 'Search' }), 'locks out');
    expect(siteColumn()).toEqual(['Oduya residenceBasement furnace']);
    expect(screen.getByText('1 call match')).toBeInTheDocument();
    await user.type(screen.getByRole('searchbox', { name: 'Search' }), ' nothing like this');
    expect(screen.queryByRole('table')).not.toBeInTheDocument();
    expect(screen.getByText('No calls match the search and filters.')).toBeInTheDocument();
  });

  it('filters by status through the API', async () => {
    const user = userEvent.setup();
    renderTable();
    await user.selectOptions(screen.getByLabelText('Status'), 'closed');
    await waitFor(() => expect(siteColumn()).toEqual(['St. Aldric Parish HallHall furnace 2']));
    expect(fetchMock.mock.calls.some(([url]) => String(url) === '/api/calls?status=closed')).toBe(true);
  });

  it('asks the API for one technician’s calls', async () => {
    const user = userEvent.setup();
    renderTable();
    await user.selectOptions(screen.getByLabelText('Technician'), 'me');
    await waitFor(() => expect(fetchMock.mock.calls.some(([url]) => String(url) === '/api/calls?technician=me')).toBe(true));
  });

  it('sorts with keyboard-operable header buttons that report aria-sort', async () => {
    const user = userEvent.setup();
    renderTable();
    const header = screen.getByRole('columnheader', { name: /Site \/ unit/ });
    within(header).getByRole('button').focus();
    await user.keyboard('{Enter}');
    const first = header.getAttribute('aria-sort');
    expect(first).not.toBe('none');
    expect(screen.getByRole('columnheader', { name: /Opened/ })).toHaveAttribute('aria-sort', 'none');
    const ascending = ['Copperfield BakeryBack-room furnace', 'Oduya residenceBasement furnace', 'St. Aldric Parish HallHall furnace 2'];
    expect(siteColumn()).toEqual(first === 'ascending' ? ascending : [...ascending].reverse());
    await user.keyboard('{Enter}');
    expect(header.getAttribute('aria-sort')).toBe(first === 'ascending' ? 'descending' : 'ascending');
    expect(siteColumn()).toEqual(first === 'ascending' ? [...ascending].reverse() : ascending);
  });

  it('hides the technician filter from apprentices', () => {
    renderTable({ technicianChoice: 'none' });
    expect(screen.queryByLabelText('Technician')).not.toBeInTheDocument();
  });

  it('shows the empty state with a way to start a call', () => {
    fetchMock.mockImplementation(async () => new Response('[]', { status: 200, headers: { 'content-type': 'application/json' } }));
    renderTable({ initialCalls: [] });
    expect(screen.getByText('No calls yet — start one')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'New call' })).toHaveAttribute('href', '/calls/new');
  });

  it('shows the server’s error with a retry that fetches again', async () => {
    const user = userEvent.setup();
    fetchMock.mockImplementation(
      async () =>
        new Response(JSON.stringify({ error: { code: 'unavailable', message: 'The database is not reachable.' } }), { status: 503 }),
    );
    renderTable({ initialCalls: undefined });
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('The database is not reachable.');
    serve();
    await user.click(within(alert).getByRole('button', { name: 'Retry' }));
    await waitFor(() => expect(siteColumn()).toHaveLength(3));
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });
});
