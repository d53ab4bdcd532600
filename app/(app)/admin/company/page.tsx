import type { Metadata } from 'next';
import { CompanySettingsForm } from '@/components/admin/company-settings-form';
import { getCompany } from '@/db/companies';
import { requirePageUser } from '@/lib/server/guard';
import { updateCompanyAction } from '../actions';

export const metadata: Metadata = { title: 'Company settings' };

export default async function CompanyPage() {
  const admin = await requirePageUser({ roles: ['admin'] });
  const company = await getCompany({ id: admin.companyId });
  return (
    <div className="space-y-6">
      <h1 className="page-title">Company settings</h1>
      <CompanySettingsForm
        initial={{ name: company.name, officeEmail: company.officeEmail, displayUnits: company.displayUnits }}
        save={updateCompanyAction}
      />
    </div>
  );
}
