"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { signOut } from "next-auth/react";
import { cn } from "@/components/ui/cn";
import type { NavItem } from "@/lib/navigation";

const GROUP_LABELS: Record<NavItem["group"], string> = { work: "Quality control", admin: "Administration", me: "You" };

function isActive(pathname: string, href: string): boolean {
  return href === "/" ? pathname === "/" : pathname === href || pathname.startsWith(`${href}/`);
}

/** Left-hand navigation. Items arrive already filtered for the user's role by the server layout. */
export function AppNav({ items, userName, roleLabel }: { items: NavItem[]; userName: string; roleLabel: string }) {
  const pathname = usePathname();
  const groups = (["work", "admin", "me"] as const).map((g) => ({ g, items: items.filter((i) => i.group === g) })).filter((x) => x.items.length);
  return (
    <nav aria-label="Main" className="flex h-full flex-col gap-6 px-3 py-5">
      <Link href="/" className="flex items-center gap-2 px-2 text-title font-semibold tracking-tight text-ink no-underline">
        <HalfmaxMark />
        Halfmax
      </Link>
      {groups.map(({ g, items: groupItems }) => (
        <div key={g}>
          <p className="px-2 pb-1 text-caption font-medium uppercase tracking-wide text-ink-subtle">{GROUP_LABELS[g]}</p>
          <ul className="space-y-0.5">
            {groupItems.map((item) => {
              const active = isActive(pathname, item.href);
              return (
                <li key={item.href}>
                  <Link
                    href={item.href}
                    aria-current={active ? "page" : undefined}
                    className={cn(
                      "block rounded-control px-2 py-1.5 no-underline",
                      active ? "bg-accent-soft font-semibold text-accent" : "text-ink-muted hover:bg-surface-hover hover:text-ink",
                    )}
                  >
                    {item.label}
                  </Link>
                </li>
              );
            })}
          </ul>
        </div>
      ))}
      <div className="mt-auto border-t border-line px-2 pt-4">
        <p className="font-medium text-ink" data-testid="current-user">{userName}</p>
        <p className="text-caption text-ink-subtle">{roleLabel}</p>
        <button
          type="button"
          onClick={() => signOut({ callbackUrl: "/login" })}
          className="mt-2 text-caption font-medium text-accent underline-offset-2 hover:underline"
        >
          Sign out
        </button>
      </div>
    </nav>
  );
}

/** Our mark: a bell-shaped spread function cut at half its height. */
function HalfmaxMark() {
  return (
    <svg width="22" height="22" viewBox="0 0 24 24" aria-hidden="true" className="text-accent">
      <path d="M2 20 C7 20 8 4 12 4 C16 4 17 20 22 20" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      <path d="M6.2 12 H17.8" stroke="currentColor" strokeWidth="2" strokeDasharray="2 2" />
    </svg>
  );
}
