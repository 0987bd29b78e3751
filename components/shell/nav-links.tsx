"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export type NavItem = { href: string; label: string };

export function NavLinks({ items, vertical = false }: { items: NavItem[]; vertical?: boolean }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Main" className={vertical ? "flex flex-col gap-1" : "-mx-1 flex gap-1 overflow-x-auto"}>
      {items.map((item) => {
        const active = item.href === "/" ? pathname === "/" : pathname.startsWith(item.href);
        return (
          <Link
            key={item.href}
            href={item.href}
            aria-current={active ? "page" : undefined}
            className={`whitespace-nowrap rounded-md px-3 py-1.5 text-sm font-medium ${active ? "bg-paper text-ink" : "text-paper/80 hover:bg-white/10 hover:text-paper"}`}
          >
            {item.label}
          </Link>
        );
      })}
    </nav>
  );
}
