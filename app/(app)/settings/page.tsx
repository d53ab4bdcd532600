import type { Metadata } from 'next';
import Link from 'next/link';
import { updateNotificationSettingsAction } from '@/app/(app)/settings/actions';
import { NotificationSettingsForm } from '@/components/mail/notification-settings-form';
import { may } from '@/lib/policy';
import { getNotificationSettings } from '@/lib/server/notify';
import { pageScope } from '@/lib/server/operation';
import { notificationSettingsOutSchema } from '@/lib/validations/mail';

export const metadata: Metadata = { title: 'My settings' };
export const dynamic = 'force-dynamic';

export default async function SettingsPage() {
  const { user, scope } = await pageScope('notifications.get');
  const current = notificationSettingsOutSchema.parse(await getNotificationSettings({ scope }));
  return (
    <div className="max-w-2xl space-y-6">
      <h1 className="page-title">My settings</h1>
      <NotificationSettingsForm initial={current} save={updateNotificationSettingsAction} />
      {may(user.role, 'mail.mailbox') && (
        <section aria-labelledby="dev-heading" className="card space-y-2">
          <h2 id="dev-heading" className="text-xl font-bold">
            Development
          </h2>
          <p className="text-muted">The e-mails the app sent to the local mail sink.</p>
          <Link href="/admin/mailbox" className="btn-secondary">
            Dev mailbox
          </Link>
        </section>
      )}
    </div>
  );
}
