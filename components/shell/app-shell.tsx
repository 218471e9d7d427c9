import Link from 'next/link';
import { signOut } from '@/app/(app)/actions';
import { can, ROLE_LABELS } from '@/lib/auth/permissions';
import type { OrgContext } from '@/lib/auth/context';
import { LogoMark } from '@/components/ui/logo';
import { NavLinks, type NavItem } from './nav-links';
import { OrganizationSwitcher } from './organization-switcher';

export function AppShell({ ctx, children }: { ctx: OrgContext; children: React.ReactNode }) {
  const items: NavItem[] = [
    { href: '/dashboard', label: 'Dashboard' },
    { href: '/coatings', label: 'Coatings' },
    { href: '/batches', label: 'Batches' },
    { href: '/probe-liquids', label: 'Probe liquids' },
    { href: '/sessions', label: 'Sessions' },
    ...(can(ctx.organization.role, 'records:write')
      ? [
          { href: '/measure', label: 'Measure' },
          { href: '/dynamic-wetting', label: 'Dynamic wetting' },
        ]
      : []),
    { href: '/compare', label: 'Compare' },
    { href: '/surface-energy', label: 'Surface energy' },
    { href: '/tensiometry', label: 'Tensiometry' },
    { href: '/reviews', label: 'Reviews' },
    ...(can(ctx.organization.role, 'team:manage') ? [{ href: '/team', label: 'Team' }] : []),
    ...(can(ctx.organization.role, 'audit:read') ? [{ href: '/audit', label: 'Audit log' }] : []),
    { href: '/api-reference', label: 'API reference' },
  ];
  return (
    <div className="min-h-screen md:flex">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-10 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <aside className="border-b border-ink-200 bg-white md:sticky md:top-0 md:flex md:h-screen md:w-60 md:flex-col md:border-b-0 md:border-r">
        <div className="flex items-center gap-2 px-4 py-4">
          <LogoMark />
          <Link href="/dashboard" className="text-lg font-semibold tracking-tight text-ink-950">
            Beadline
          </Link>
        </div>
        <div className="px-4 pb-3">
          <OrganizationSwitcher options={ctx.memberships} activeId={ctx.organization.id} />
          <p className="mt-1 text-xs text-ink-500">
            {ROLE_LABELS[ctx.organization.role].name} · {ctx.user.name}
          </p>
        </div>
        <nav aria-label="Sections" className="px-2 pb-3 md:flex-1 md:overflow-y-auto">
          <NavLinks items={items} />
        </nav>
        <SignOutButton className="hidden px-4 py-4 md:block" />
      </aside>
      <main id="main" className="min-w-0 flex-1 px-4 py-6 md:px-10 md:py-8">
        {children}
        <SignOutButton className="mt-10 md:hidden" />
      </main>
    </div>
  );
}

/** Signing out is a form, so it works before the page's scripts have loaded. */
function SignOutButton({ className }: { className: string }) {
  return (
    <form action={signOut} className={className}>
      <button type="submit" className="btn-quiet w-full">
        Sign out
      </button>
    </form>
  );
}
