// Who may do what. The single table every route handler, server action and page consults.

export const roles = ["admin", "engineer", "technician", "viewer"] as const;
export type Role = (typeof roles)[number];

export const permissions = {
  "sites:read": ["admin", "engineer", "technician", "viewer"],
  "sites:write": ["admin", "engineer", "technician"],
  "captures:read": ["admin", "engineer", "technician", "viewer"],
  "captures:upload": ["admin", "engineer", "technician"],
  "captures:review": ["admin", "engineer"],
  "captures:share": ["admin", "engineer"],
  "limits:read": ["admin", "engineer", "technician", "viewer"],
  "limits:write": ["admin"],
  "users:manage": ["admin"],
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
