'use client';
import Link from 'next/link';
import { usePathname } from 'next/navigation';

export function NavLinks({ canManage }: { canManage: boolean }) {
  const path = usePathname();
  const links = [
    { href: '/jobs', label: 'Jobs' },
    { href: '/vehicles', label: 'Vehicles' },
    { href: '/shop', label: canManage ? 'Shop & members' : 'Shop' },
  ];
  return (
    <nav aria-label="Main" className="flex flex-1 gap-1">
      {links.map((l) => {
        const active = path === l.href || path.startsWith(`${l.href}/`);
        return (
          <Link
            key={l.href}
            href={l.href}
            aria-current={active ? 'page' : undefined}
            className={`min-h-touch content-center rounded-lg px-3 font-bold ${active ? 'bg-brand text-brand-ink' : 'hover:bg-raised'}`}
          >
            {l.label}
          </Link>
        );
      })}
    </nav>
  );
}
