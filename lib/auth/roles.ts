/** The four workspace roles (see the roles table in the product description), most powerful first. */
export const roles = ['admin', 'engineer', 'reviewer', 'regulator'] as const;
export type Role = (typeof roles)[number];

/** Human-readable role names for the interface. */
export const roleLabels: Record<Role, string> = {
  admin: 'Admin',
  engineer: 'Engineer',
  reviewer: 'Reviewer',
  regulator: 'Regulator',
};

/** True when `value` is one of the four roles. */
export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (roles as readonly string[]).includes(value);
}
