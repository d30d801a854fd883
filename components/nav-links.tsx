'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import type { Me } from './api-types';

interface NavItem {
  href: string;
  label: string;
  adminOnly?: boolean;
}

const items: NavItem[] = [
  { href: '/studies', label: 'Studies' },
  { href: '/samples', label: 'Samples' },
  { href: '/profile', label: 'Profile' },
  { href: '/admin/users', label: 'Users', adminOnly: true },
  { href: '/admin/mail', label: 'Outbox', adminOnly: true },
  { href: '/admin/processing', label: 'Processing', adminOnly: true },
];

/** The main navigation; the admin section appears for site admins only. */
export function NavLinks({ me, onNavigate }: { me: Me; onNavigate?: () => void }) {
  const pathname = usePathname();
  const visible = items.filter((item) => !item.adminOnly || me.siteRole === 'admin');
  return (
    <nav aria-label="Main">
      <ul className="space-y-0.5">
        {visible.map((item) => {
          const active = pathname === item.href || pathname.startsWith(`${item.href}/`);
          return (
            <li key={item.href}>
              <Link
                href={item.href}
                onClick={onNavigate}
                aria-current={active ? 'page' : undefined}
                className={`flex items-center rounded-md border-l-2 px-3 py-2 text-sm font-medium ${
                  active
                    ? 'border-accent bg-accent-soft/60 text-accent-strong'
                    : 'border-transparent text-ink-soft hover:bg-paper-sunk hover:text-ink'
                }`}
              >
                {item.label}
                {item.adminOnly && <span className="ml-auto text-[0.65rem] uppercase tracking-wider text-ink-faint">admin</span>}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
