import { STATUS_ICONS, STATUS_LABELS } from '@/components/calls/format';
import type { CallStatus } from '@/lib/validations/field';

export function CallStatusBadge({ status }: { status: CallStatus }) {
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full border border-line bg-surface px-2.5 py-0.5 text-sm font-semibold">
      <span aria-hidden className="font-mono">
        {STATUS_ICONS[status]}
      </span>
      {STATUS_LABELS[status]}
    </span>
  );
}
