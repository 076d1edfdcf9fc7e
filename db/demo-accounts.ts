/** Plain data (no database imports), so end-to-end tests can read it too. */
import type { Role } from '@/lib/auth/roles';

/** The demo accounts; the passwords are public demo values, printed by the seed and in the README. */
export const demoAccounts = [
  { role: 'admin', email: 'ada.admin@larkspur.example', name: 'Ada Achterberg', password: 'larkspur-admin-1' },
  { role: 'engineer', email: 'eli.engineer@larkspur.example', name: 'Eli Ekwueme', password: 'larkspur-engineer-1' },
  { role: 'reviewer', email: 'rhea.reviewer@larkspur.example', name: 'Rhea Rautio', password: 'larkspur-reviewer-1' },
  { role: 'regulator', email: 'rafe.regulator@larkspur.example', name: 'Rafe Ruiz-Lindqvist', password: 'larkspur-regulator-1' },
] as const satisfies ReadonlyArray<{ role: Role; email: string; name: string; password: string }>;
