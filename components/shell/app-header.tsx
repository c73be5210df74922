import Link from "next/link";
import { BrandMark } from "@/components/ui/brand-mark";
import { SHEET_CHECK } from "@/lib/format/words";
import { ROLE_LABELS, rolesAllow, type Permission, type RoleName } from "@/lib/auth/permissions";
import type { InboxRole } from "@/lib/server/inbox";
import { InboxBadge } from "./inbox-badge";
import { inboxBadgeId } from "./inbox-ids";
import { SignOutButton } from "./sign-out-button";
import { WaitingMenu } from "./waiting-menu";

/** `waiting`: whose "waiting for you" count (GET /api/inbox) is shown beside the link. */
type NavItem = { href: string; label: string; needs?: Permission; external?: boolean; waiting?: InboxRole };

const INBOX_ROLES: readonly RoleName[] = ["officer", "researcher", "technician", "auditor"];
const LINK = "whitespace-nowrap rounded-md px-2.5 py-2 text-sm text-text no-underline hover:bg-raised";

export function AppHeader({ name, roles, mailCatcherUrl }: { name: string; roles: RoleName[]; mailCatcherUrl?: string }) {
  const items: NavItem[] = [
    { href: "/", label: "Home" },
    { href: "/benches", label: "Benches", needs: { bench: ["read"] }, waiting: "researcher" },
    { href: "/reviews", label: "Reviews", needs: { review: ["decide"] }, waiting: "officer" },
    { href: "/builds", label: "Builds", needs: { build: ["record"] }, waiting: "technician" },
    { href: "/lasers", label: "Lasers", needs: { register: ["read"] } },
    { href: "/eyewear", label: "Eyewear", needs: { eyewear: ["read"] } },
    { href: "/desk", label: "Sign-off desk", needs: { audit: ["read"] }, waiting: "auditor" },
    { href: "/verify", label: SHEET_CHECK, needs: { bench: ["read"] } },
    { href: "/admin/people", label: "People", needs: { user: ["list"] } },
    { href: "/admin/labs", label: "Labs", needs: { lab: ["manage"] } },
  ];
  if (mailCatcherUrl) items.push({ href: mailCatcherUrl, label: "Caught mail", needs: { mail: ["read"] }, external: true });
  const visible = items.filter((i) => !i.needs || rolesAllow(roles, i.needs));
  const hasInbox = roles.some((r) => INBOX_ROLES.includes(r));
  const links = (
    <>
      {visible.map((i) =>
        i.external ? (
          <a key={i.href} href={i.href} className={LINK} target="_blank" rel="noreferrer">
            {i.label} ↗
          </a>
        ) : i.waiting && roles.includes(i.waiting) ? (
          // The badge sits beside the link, not inside it, so the link's name stays its label.
          <span key={i.href} className="inline-flex items-center whitespace-nowrap">
            <Link href={i.href} aria-describedby={inboxBadgeId(i.waiting)} className={LINK}>
              {i.label}
            </Link>
            <InboxBadge role={i.waiting} />
          </span>
        ) : (
          <Link key={i.href} href={i.href} className={LINK}>
            {i.label}
          </Link>
        ),
      )}
    </>
  );
  return (
    <header className="border-b border-line bg-panel">
      <div className="mx-auto flex max-w-[90rem] items-center gap-x-4 gap-y-2 px-4 py-2 lg:py-3">
        <Link href="/" aria-label="Benchwarden, home" className="flex shrink-0 items-center gap-2 text-accent no-underline">
          <BrandMark />
          {/* on a phone the mark alone, so the header keeps to one line */}
          <span className="hidden text-lg font-semibold text-text sm:inline">Benchwarden</span>
        </Link>
        {/* wide screens: one line of links */}
        <nav aria-label="Main" className="hidden min-w-0 flex-1 flex-nowrap items-center gap-0.5 xl:flex">
          {links}
        </nav>
        <div className="ml-auto flex shrink-0 items-center gap-2 sm:gap-3">
          {hasInbox ? <WaitingMenu /> : null}
          <div className="hidden text-right leading-tight sm:block">
            <p className="text-sm font-medium" data-testid="signed-in-name">
              {name}
            </p>
            <p className="text-xs text-muted">{roles.map((r) => ROLE_LABELS[r]).join(" · ")}</p>
          </div>
          <SignOutButton />
        </div>
      </div>
      {/* narrower screens: the links fold under a "Menu" button, so the header stays one line on a phone */}
      <details className="group border-t border-line xl:hidden">
        <summary className="mx-auto flex max-w-[90rem] cursor-pointer list-none items-center justify-between gap-2 px-4 py-2 text-sm">
          <span className="font-medium">Menu</span>
          <span className="truncate text-muted sm:hidden" data-testid="signed-in-name-small">
            {name}
          </span>
        </summary>
        <nav aria-label="Main" className="mx-auto flex max-w-[90rem] flex-wrap gap-1 px-3 pb-2">
          {links}
        </nav>
      </details>
    </header>
  );
}
