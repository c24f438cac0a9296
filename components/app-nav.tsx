"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { appNavConfig } from "@/config/nav";
import { NavIcon } from "@/components/ui/nav-icon";

/** Highlights the current section; vertical on wide screens, a scrollable strip on phones. */
export function AppNav({ orientation }: { orientation: "vertical" | "horizontal" }) {
  const pathname = usePathname();
  const vertical = orientation === "vertical";
  return (
    <nav aria-label="Main" className={vertical ? "flex flex-col gap-1" : "flex gap-1 overflow-x-auto px-3 pb-2"}>
      {appNavConfig.map((item) => {
        const active = pathname === item.href || pathname.startsWith(`${item.href}/`);
        return (
          <Link
            key={item.href}
            href={item.href}
            aria-current={active ? "page" : undefined}
            className={[
              "flex min-h-11 shrink-0 items-center gap-3 rounded-md px-3 text-sm font-medium transition-colors",
              active ? "bg-tide-700 text-white" : vertical ? "text-tide-50 hover:bg-tide-700/60" : "bg-card text-ink border border-rule",
            ].join(" ")}
          >
            <NavIcon name={item.icon} />
            {item.label}
          </Link>
        );
      })}
    </nav>
  );
}
