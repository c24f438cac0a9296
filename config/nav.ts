/** Main navigation of the signed-in app, in the order shown. */
export const appNavConfig = [
  { href: "/dashboard", label: "Overview", icon: "home" },
  { href: "/runs", label: "Runs", icon: "runs" },
  { href: "/builds", label: "Builds", icon: "builds" },
  { href: "/routes", label: "Route plans", icon: "routes" },
  { href: "/crew", label: "Crew", icon: "crew" },
  { href: "/settings", label: "Settings", icon: "settings" },
] as const;

export type NavIcon = (typeof appNavConfig)[number]["icon"];
