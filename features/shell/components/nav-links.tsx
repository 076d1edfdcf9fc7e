'use client';
import Link from 'next/link';
import { usePathname } from 'next/navigation';

export interface NavItem {
  href: string;
  label: string;
}

export function NavLinks({ items }: { items: NavItem[] }) {
  const pathname = usePathname();
  return (
    <ul className="flex gap-1">
      {items.map((item) => {
        const current = pathname === item.href || pathname.startsWith(`${item.href}/`);
        return (
          <li key={item.href}>
            <Link
              href={item.href}
              aria-current={current ? 'page' : undefined}
              className={`rounded-md px-3 py-1.5 text-sm font-medium ${current ? 'bg-white text-ink' : 'text-white/90 hover:bg-white/10'}`}
            >
              {item.label}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
