import Link from "next/link";
import { BrandMark } from "@/components/ui/brand-mark";
import { ROLE_LABELS, rolesAllow, type Permission, type RoleName } from "@/lib/auth/permissions";
import type { InboxRole } from "@/lib/server/inbox";
import { InboxBadge } from "./inbox-badge";
import { inboxBadgeId } from "./inbox-ids";
import { SignOutButton } from "./sign-out-button";
import { WaitingMenu } from "./waiting-menu";

/** `waiting`: whose "waiting for you" count (GET /api/inbox) is shown beside the link. */
type NavItem = { href: string; label: string; needs?: Permission; external?: boolean; waiting?: InboxRole };

const INBOX_ROLES: readonly RoleName[] = ["officer", "researcher", "technician", "auditor"];

export function AppHeader({ name, roles, mailCatcherUrl }: { name: string; roles: RoleName[]; mailCatcherUrl?: string }) {
  const items: NavItem[] = [
    { href: "/", label: "Home" },
    { href: "/benches", label: "Benches", needs: { bench: ["read"] }, waiting: "researcher" },
    { href: "/reviews", label: "Reviews", needs: { review: ["decide"] }, waiting: "officer" },
    { href: "/builds", label: "Builds", needs: { build: ["record"] }, waiting: "technician" },
    { href: "/lasers", label: "Lasers", needs: { register: ["read"] } },
    { href: "/eyewear", label: "Eyewear", needs: { eyewear: ["read"] } },
    { href: "/desk", label: "Sign-off desk", needs: { audit: ["read"] }, waiting: "auditor" },
    { href: "/verify", label: "Check a sheet", needs: { bench: ["read"] } },
    { href: "/admin/people", label: "People", needs: { user: ["list"] } },
    { href: "/admin/labs", label: "Labs", needs: { lab: ["manage"] } },
  ];
  if (mailCatcherUrl) items.push({ href: mailCatcherUrl, label: "Caught mail", needs: { mail: ["read"] }, external: true });
  const visible = items.filter((i) => !i.needs || rolesAllow(roles, i.needs));
  const hasInbox = roles.some((r) => INBOX_ROLES.includes(r));
  return (
    <header className="border-b border-line bg-panel">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <Link href="/" className="flex items-center gap-2 text-accent no-underline">
          <BrandMark />
          <span className="text-lg font-semibold text-text">Benchwarden</span>
        </Link>
        <nav aria-label="Main" className="flex flex-1 flex-wrap gap-1">
          {visible.map((i) =>
            i.external ? (
              <a key={i.href} href={i.href} className="rounded-md px-3 py-2 text-text no-underline hover:bg-raised" target="_blank" rel="noreferrer">
                {i.label} ↗
              </a>
            ) : (
              i.waiting && roles.includes(i.waiting) ? (
                // The badge sits beside the link, not inside it, so the link's name stays its label.
                <span key={i.href} className="inline-flex items-center">
                  <Link href={i.href} aria-describedby={inboxBadgeId(i.waiting)} className="rounded-md px-3 py-2 text-text no-underline hover:bg-raised">
                    {i.label}
                  </Link>
                  <InboxBadge role={i.waiting} />
                </span>
              ) : (
                <Link key={i.href} href={i.href} className="rounded-md px-3 py-2 text-text no-underline hover:bg-raised">
                  {i.label}
                </Link>
              )
            ),
          )}
        </nav>
        <div className="flex items-center gap-3">
          {hasInbox ? <WaitingMenu /> : null}
          <div className="text-right leading-tight">
            <p className="text-sm font-medium" data-testid="signed-in-name">{name}</p>
            <p className="text-xs text-muted">{roles.map((r) => ROLE_LABELS[r]).join(" · ")}</p>
          </div>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
