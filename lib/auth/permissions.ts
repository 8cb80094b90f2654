// Who may do what. The single table every route handler, server action and page consults.

export const roles = ["admin", "engineer", "technician", "viewer"] as const;
export type Role = (typeof roles)[number];

export const permissions = {
  "sites:read": ["admin", "engineer", "technician", "viewer"],
  // Technicians may add a site; changing an existing one is an engineer's.
  "sites:create": ["admin", "engineer", "technician"],
  "sites:write": ["admin", "engineer"],
  "captures:read": ["admin", "engineer", "technician", "viewer"],
  "captures:upload": ["admin", "engineer", "technician"],
  "captures:review": ["admin", "engineer"],
  // "Try a fix": running a new what-if on a capture. Viewers read the saved studies of approved sheets but run none.
  "captures:what-if": ["admin", "engineer", "technician"],
  "captures:share": ["admin", "engineer"],
  "limits:read": ["admin", "engineer", "technician", "viewer"],
  "limits:write": ["admin"],
  "users:manage": ["admin"],
  "customers:manage": ["admin"],
  "mailbox:read": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof permissions;

export function can(role: Role, permission: Permission): boolean {
  return (permissions[permission] as readonly Role[]).includes(role);
}

export const roleLabels: Record<Role, string> = {
  admin: "Admin",
  engineer: "Engineer",
  technician: "Technician",
  viewer: "Viewer",
};

/** Who is asking, as far as object-level rules care. */
export interface Reader {
  id: string;
  role: Role;
}

/**
 * Which captures and sites a reader may see at all (object level, after the role check).
 * Viewers are outside parties: only approved captures of sites owned by a customer they belong to.
 * Everyone else works for the lab and sees everything. Unknown or out-of-scope objects read as "not found".
 */
export type ReadScope = { kind: "all" } | { kind: "customer-member"; userId: string; approvedOnly: true };

export function readScope(reader: Reader): ReadScope {
  return reader.role === "viewer" ? { kind: "customer-member", userId: reader.id, approvedOnly: true } : { kind: "all" };
}

/**
 * Whether this reader sees only the approved result of a capture (its approved evaluation, the analysis
 * behind it and the mitigation studies started from it) — outside parties; the team sees every result.
 */
export function readsApprovedResultOnly(reader: Reader): boolean {
  return readScope(reader).kind === "customer-member";
}

/** Whether internal review comments and the review history may be shown to this reader. */
export function canSeeReviewComments(reader: Reader): boolean {
  return reader.role !== "viewer";
}

/**
 * Whether `reader` may change a capture's upload, set-up or run its analysis, or submit it.
 * Engineers and admins may change any capture; a technician only one they uploaded, until it is submitted
 * (draft, or sent back to them). Viewers never.
 */
export function canEditCapture(reader: Reader, capture: { uploadedBy: string | null; reviewState: "draft" | "in_review" | "approved" | "sent_back" }): boolean {
  if (reader.role === "admin" || reader.role === "engineer") return true;
  if (reader.role !== "technician") return false;
  return capture.uploadedBy === reader.id && (capture.reviewState === "draft" || capture.reviewState === "sent_back");
}

/** The reader for work the system does on its own behalf (the analysis worker, a valid share link's sheet). */
export const systemReader: Reader = { id: "system", role: "admin" };
