import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { NewCallForm, type PickerSite } from '@/components/calls/new-call-form';
import { siteSchema } from '@/lib/validations/field';

const router = { replace: vi.fn(), refresh: vi.fn(), push: vi.fn(), back: vi.fn(), forward: vi.fn(), prefetch: vi.fn() };
vi.mock('next/navigation', () => ({ useRouter: () => router }));

const SITE_ID = '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a01';
const UNIT_ID = '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a02';
const ME = { id: '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a03', name: 'Dale Ferris' };

const SITES: PickerSite[] = [
  {
    id: SITE_ID,
    name: 'Oduya residence',
    address: '41 Larchmont Rise, Fenwick',
    contactEmail: null,
    units: [
      {
        id: UNIT_ID,
        siteId: SITE_ID,
        label: 'Basement furnace',
        ignition: 'two-rod',
        fuel: 'natural-gas',
        controlSupply: '24v',
        draft: 'induced',
        transformerVa: 40,
        installYear: 2011,
      },
    ],
  },
];

function setup(over: Partial<React.ComponentProps<typeof NewCallForm>> = {}) {
  const props = {
    sites: SITES,
    assignees: [],
    me: ME,
    createSite: vi.fn(),
    createUnit: vi.fn(),
    createCall: vi.fn(),
    ...over,
  };
  render(<NewCallForm {...props} />);
  return props;
}

beforeEach(() => {
  for (const fn of Object.values(router)) fn.mockReset();
});

describe('NewCallForm', () => {
  it('needs a unit before the call can be opened', () => {
    setup();
    expect(screen.getByRole('button', { name: 'Open the call' })).toBeDisabled();
    expect(screen.getByText('Pick or add the site first.')).toBeInTheDocument();
  });

  it('shows the complaint error from the schema and sends nothing', async () => {
    const user = userEvent.setup();
    const props = setup({ preselectUnitId: UNIT_ID });
    expect(screen.getByRole('radio', { name: /Basement furnace/ })).toBeChecked();
    await user.click(screen.getByRole('button', { name: 'Open the call' }));
    expect(await screen.findByText('Describe the complaint.')).toBeInTheDocument();
    expect(screen.getByLabelText('Complaint')).toHaveAttribute('aria-invalid', 'true');
    expect(props.createCall).not.toHaveBeenCalled();
  });

  it('shows the server’s refusal and its field error', async () => {
    const user = userEvent.setup();
    const createCall = vi.fn().mockResolvedValue({
      ok: false,
      message: 'That technician is not an active field user of your company.',
      fieldErrors: { technicianId: ['Choose someone from the list.'] },
    });
    setup({ preselectUnitId: UNIT_ID, createCall, assignees: [{ id: ME.id, name: 'Dale Ferris', role: 'technician' }] });
    await user.selectOptions(screen.getByLabelText('Technician'), ME.id);
    await user.type(screen.getByLabelText('Complaint'), 'No heat');
    await user.click(screen.getByRole('button', { name: 'Open the call' }));
    expect(await screen.findByText('That technician is not an active field user of your company.')).toBeInTheDocument();
    expect(screen.getByText('Choose someone from the list.')).toBeInTheDocument();
    expect(createCall).toHaveBeenCalledWith({ unitId: UNIT_ID, complaint: 'No heat', technicianId: ME.id });
    expect(router.push).not.toHaveBeenCalled();
  });

  it('checks the new site’s fields before saving it', async () => {
    const user = userEvent.setup();
    const props = setup();
    await user.click(screen.getByRole('button', { name: 'Add a new site' }));
    const group = within(screen.getByRole('group', { name: 'New site' }));
    await user.type(group.getByLabelText('Customer e-mail'), 'not-an-address');
    await user.click(group.getByRole('button', { name: 'Add site' }));
    expect(await group.findByText('Enter the site name.')).toBeInTheDocument();
    expect(group.getByText('Enter the address.')).toBeInTheDocument();
    expect(group.getByText('Enter a valid e-mail address.')).toBeInTheDocument();
    expect(props.createSite).not.toHaveBeenCalled();
  });

  it('adds a site with the optional customer e-mail left empty, with no error', async () => {
    const user = userEvent.setup();
    const created = { id: '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a20', name: 'Birchfield duplex', address: '12 Mill Road', contactEmail: null };
    const createSite = vi.fn().mockResolvedValue({ ok: true, data: created });
    setup({ createSite });
    await user.click(screen.getByRole('button', { name: 'Add a new site' }));
    const group = within(screen.getByRole('group', { name: 'New site' }));
    await user.type(group.getByLabelText('Site name'), created.name);
    await user.type(group.getByLabelText('Address'), created.address);
    await user.click(group.getByRole('button', { name: 'Add site' }));
    await waitFor(() => expect(screen.getByRole('radio', { name: /Birchfield duplex/ })).toBeChecked());
    // What the form sends is what the server's schema takes: no e-mail is null, never "".
    expect(createSite).toHaveBeenCalledWith({ name: created.name, address: created.address, contactEmail: null });
    expect(siteSchema.safeParse(createSite.mock.calls[0][0]).success).toBe(true);
    expect(screen.queryByRole('alert')).toBeEmptyDOMElement();
  });

  it('shows a server refusal of the new site in words, beside its field', async () => {
    const user = userEvent.setup();
    const createSite = vi.fn().mockResolvedValue({
      ok: false,
      code: 'bad_request',
      message: 'The customer e-mail address is at most 254 characters.',
      fieldErrors: { contactEmail: ['The customer e-mail address is at most 254 characters.'] },
    });
    setup({ createSite });
    await user.click(screen.getByRole('button', { name: 'Add a new site' }));
    const group = within(screen.getByRole('group', { name: 'New site' }));
    await user.type(group.getByLabelText('Site name'), 'Birchfield duplex');
    await user.type(group.getByLabelText('Address'), '12 Mill Road');
    await user.click(group.getByRole('button', { name: 'Add site' }));
    expect(await group.findAllByText('The customer e-mail address is at most 254 characters.')).toHaveLength(2);
    expect(group.getByLabelText('Customer e-mail')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.queryByText(/Invalid input/)).not.toBeInTheDocument();
  });

  it('checks the new unit’s rating and year', async () => {
    const user = userEvent.setup();
    const props = setup();
    await user.click(screen.getByRole('radio', { name: /Oduya residence/ }));
    await user.click(screen.getByRole('button', { name: 'Add a unit at this site' }));
    const group = within(screen.getByRole('group', { name: 'New unit' }));
    await user.type(group.getByLabelText('Unit label'), 'Attic furnace');
    await user.clear(group.getByLabelText('Transformer rating (VA)'));
    await user.type(group.getByLabelText('Transformer rating (VA)'), '5');
    await user.type(group.getByLabelText('Install year'), String(new Date().getFullYear() + 1));
    await user.click(group.getByRole('button', { name: 'Add unit' }));
    expect(await group.findByText('A control transformer is at least 10 VA.')).toBeInTheDocument();
    expect(group.getByText('The install year cannot be in the future.')).toBeInTheDocument();
    expect(props.createUnit).not.toHaveBeenCalled();
  });

  it('adds a site and a unit inline, opens the call for yourself and goes to it', async () => {
    const user = userEvent.setup();
    const newSite = {
      id: '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a10',
      name: 'Harrowgate cottage',
      address: '9 Quarry Lane',
      contactEmail: 'owner@harrowgate.example.test',
    };
    const newUnit = {
      id: '3f1c0a52-5d0e-4c43-9a43-0f3b6f0d1a11',
      siteId: newSite.id,
      label: 'Utility-room furnace',
      ignition: 'single-rod',
      fuel: 'lp',
      controlSupply: 'line',
      draft: 'natural',
      transformerVa: 75,
      installYear: 2018,
    };
    const createSite = vi.fn().mockResolvedValue({ ok: true, data: newSite });
    const createUnit = vi.fn().mockResolvedValue({ ok: true, data: newUnit });
    const createCall = vi.fn().mockResolvedValue({ ok: true, data: { id: 'call-1' } });
    setup({ createSite, createUnit, createCall });

    await user.click(screen.getByRole('button', { name: 'Add a new site' }));
    const siteGroup = within(screen.getByRole('group', { name: 'New site' }));
    await user.type(siteGroup.getByLabelText('Site name'), newSite.name);
    await user.type(siteGroup.getByLabelText('Address'), newSite.address);
    await user.type(siteGroup.getByLabelText('Customer e-mail'), 'Owner@Harrowgate.example.test');
    await user.click(siteGroup.getByRole('button', { name: 'Add site' }));
    await waitFor(() => expect(screen.getByRole('radio', { name: /Harrowgate cottage/ })).toBeChecked());
    expect(createSite).toHaveBeenCalledWith({
      name: newSite.name,
      address: newSite.address,
      contactEmail: 'owner@harrowgate.example.test',
    });

    await user.click(screen.getByRole('button', { name: 'Add a unit at this site' }));
    const unitGroup = within(screen.getByRole('group', { name: 'New unit' }));
    await user.type(unitGroup.getByLabelText('Unit label'), newUnit.label);
    await user.click(unitGroup.getByRole('radio', { name: /DSI, single-rod/ }));
    await user.click(unitGroup.getByRole('radio', { name: /^LP/ }));
    await user.click(unitGroup.getByRole('radio', { name: /Line-powered control/ }));
    await user.click(unitGroup.getByRole('radio', { name: /Natural draft/ }));
    await user.clear(unitGroup.getByLabelText('Transformer rating (VA)'));
    await user.type(unitGroup.getByLabelText('Transformer rating (VA)'), '75');
    await user.type(unitGroup.getByLabelText('Install year'), '2018');
    await user.click(unitGroup.getByRole('button', { name: 'Add unit' }));
    await waitFor(() => expect(screen.getByRole('radio', { name: /Utility-room furnace/ })).toBeChecked());
    expect(createUnit).toHaveBeenCalledWith({
      siteId: newSite.id,
      label: newUnit.label,
      ignition: 'single-rod',
      fuel: 'lp',
      controlSupply: 'line',
      draft: 'natural',
      transformerVa: 75,
      installYear: 2018,
    });

    expect(screen.getByText('Dale Ferris (you)')).toBeInTheDocument();
    await user.type(screen.getByLabelText('Complaint'), 'Clicks but never lights');
    await user.click(screen.getByRole('button', { name: 'Open the call' }));
    await waitFor(() => expect(router.push).toHaveBeenCalledWith('/calls/call-1'));
    expect(createCall).toHaveBeenCalledWith({ unitId: newUnit.id, complaint: 'Clicks but never lights', technicianId: ME.id });
  });
});
