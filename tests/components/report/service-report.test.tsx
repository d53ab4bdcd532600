import { render, screen, within } from '@testing-library/react';
import { ServiceReport } from '@/components/report/service-report';
import { customerReport } from '@/lib/pdf/report-model';
import { callReportSchema } from '@/lib/validations/api';
import { reportFixture } from '../../support/report-fixture';

// The two versions of the service report on the web page, from the same read model as the PDF.

const report = callReportSchema.parse(reportFixture());

describe('ServiceReport', () => {
  it('customer copy: the finding, the readings against their bands, the checks, the finding’s caution only', () => {
    render(<ServiceReport report={report} version="customer" />);
    const article = screen.getByRole('article');
    expect(within(article).getByRole('heading', { name: 'What we found' })).toBeInTheDocument();
    expect(article).toHaveTextContent('Dirty or oxidized flame rod');
    const table = within(article).getByRole('table');
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((r) => r.textContent)).toEqual([
      'Line voltage at the unit119.6 VAC●Within— Normal line voltage',
      'Flame signal (DC microamps)0.6 µA▼Below— Low flame signal',
      'Flame signal (DC microamps) after the repair4.2 µA●Within— Good flame signal',
    ]);
    expect(article).toHaveTextContent('Three full heat cycles');
    expect(
      within(article)
        .getAllByRole('note')
        .map((n) => n.getAttribute('aria-label')),
    ).toEqual(['WARNING']);
    expect(article).not.toHaveTextContent('Lock out the power and verify');
    expect(article).not.toHaveTextContent('Line voltage inside the cabinet');
    expect(article).toHaveTextContent(
      "This report does not replace local codes, the equipment manufacturer's instructions or licensed practice.",
    );
  });

  it('office record: every step, the lock-out checklist once, every caution, who did what', () => {
    render(<ServiceReport report={report} version="office" />);
    const article = screen.getByRole('article');
    expect(article.textContent!.match(/Lock-out: Lock out the power and verify/g)).toHaveLength(2);
    expect(within(article).getAllByText('Absence of voltage verified at the unit')).toHaveLength(1);
    expect(within(article).getByText('Checklist as above.')).toBeInTheDocument();
    expect(
      within(article)
        .getAllByRole('note')
        .map((n) => n.getAttribute('aria-label')),
    ).toEqual(['DANGER', 'WARNING']);
    expect(article).toHaveTextContent('Rosa Imbert closed the call');
  });

  it('says so when the fault was not isolated', () => {
    const escalated = structuredClone(report);
    escalated.diagnoses[0] = { ...escalated.diagnoses[0], status: 'escalated', finding: null, findingDetail: null };
    const c = customerReport(escalated);
    expect(c.findings).toEqual([]);
    expect(c.open[0]).toMatch(/not pinned down/);
    expect(c.cautions).toEqual([]);
  });
});
