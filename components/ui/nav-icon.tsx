import type { NavIcon as Name } from "@/config/nav";

const paths: Record<Name, string> = {
  home: "M4 11 12 4l8 7v9h-5v-5H9v5H4z",
  runs: "M3 17c3-9 6-9 9-4s6 5 9-4M3 21h18",
  builds: "M5 9h14v8H5zM8 9V6h8v3M7 17v3M17 17v3",
  routes: "M6 19a2 2 0 1 0 0-4 2 2 0 0 0 0 4zM18 9a2 2 0 1 0 0-4 2 2 0 0 0 0 4zM7.5 15.5 16.5 8.5",
  crew: "M9 11a3 3 0 1 0 0-6 3 3 0 0 0 0 6zM3 20c0-3.3 2.7-6 6-6s6 2.7 6 6M16 11a2.5 2.5 0 1 0 0-5M18 20c0-2.4-1-4.4-2.6-5.4",
  settings: "M12 15a3 3 0 1 0 0-6 3 3 0 0 0 0 6zM12 2v3M12 19v3M2 12h3M19 12h3M4.9 4.9l2.1 2.1M17 17l2.1 2.1M4.9 19.1 7 17M17 7l2.1-2.1",
};

export function NavIcon({ name, className = "h-5 w-5" }: { name: Name; className?: string }) {
  return (
    <svg viewBox="0 0 24 24" className={className} fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" aria-hidden="true">
      <path d={paths[name]} />
    </svg>
  );
}
