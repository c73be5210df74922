// Shared by the server-rendered header and the client badge: the id the nav link's aria-describedby names.
import type { InboxRole } from "@/lib/server/inbox";

export const inboxBadgeId = (role: InboxRole) => `inbox-count-${role}`;
