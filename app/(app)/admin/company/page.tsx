import type { Metadata } from 'next';
import { CompanySettingsForm } from '@/components/admin/company-settings-form';
import { getCompany } from '@/db/companies';
import { pageScope } from '@/lib/server/operation';
import { updateCompanyAction } from '../actions';

export const metadata: Metadata = { title: 'Company settings' };

export default async function CompanyPage() {
  const { scope } = await pageScope('company.update');
  const company = await getCompany({ id: scope.companyId });
  return (
    <div className="space-y-6">
      <h1 className="page-title">Company settings</h1>
      <CompanySettingsForm
        initial={{ name: company.name, officeEmail: company.officeEmail, displayUnits: company.displayUnits, timeZone: company.timeZone }}
        save={updateCompanyAction}
      />
    </div>
  );
}
