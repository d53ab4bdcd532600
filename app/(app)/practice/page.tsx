import type { Metadata } from 'next';
import { ComingLater } from '@/components/shell/coming-later';
import { requirePageUser } from '@/lib/server/guard';

export const metadata: Metadata = { title: 'Practice' };

export default async function PracticePage() {
  const user = await requirePageUser({ page: '/practice' });
  return (
    <ComingLater title={user.role === 'trainer' ? 'Practice scenarios' : 'Practice'}>
      {user.role === 'trainer'
        ? 'Here you will assign practice scenarios — a bench fault on a simulated furnace — to apprentices, and review their attempts: the finding reached, the steps taken, the safety actions observed and the time.'
        : 'Here you will find the practice scenarios your trainer assigns: a simulated furnace with one fault, measured on a schematic of its circuit, and scored.'}
    </ComingLater>
  );
}
