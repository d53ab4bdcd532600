import type { Metadata } from 'next';
import { SignInForm } from '@/components/auth/sign-in-form';
import { Brand } from '@/components/ui/brand';
import { ThemeToggle } from '@/components/ui/theme-toggle';

export const metadata: Metadata = { title: 'Sign in' };

export default function SignInPage() {
  return (
    <main className="flex min-h-dvh flex-col">
      <div className="flex items-center justify-between px-4 py-3 sm:px-8">
        <Brand />
        <ThemeToggle />
      </div>
      <div className="flex flex-1 items-center justify-center px-4 pb-16">
        <div className="w-full max-w-md">
          <h1 className="page-title mb-2">Sign in</h1>
          <p className="mb-6 text-muted">
            Guided fault isolation for direct spark ignition furnaces, for your company&apos;s technicians, apprentices, leads and trainers.
          </p>
          <div className="card">
            <SignInForm />
          </div>
          <p className="mt-6 text-sm text-muted">
            Gas, line voltage and a high-voltage spark can injure or kill. This app guides; it does not replace local codes, the equipment
            manufacturer&apos;s instructions or licensed practice.
          </p>
        </div>
      </div>
    </main>
  );
}
