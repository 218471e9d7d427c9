import { AppShell } from '@/components/shell/app-shell';
import { requirePage } from '@/lib/auth/guard';

export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const ctx = await requirePage('organization:read');
  return <AppShell ctx={ctx}>{children}</AppShell>;
}
