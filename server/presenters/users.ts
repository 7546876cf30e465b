import type { UserRow } from '@shared/contracts/users.ts';
import type { UserRecord } from '../services/users.ts';

export function presentUser(u: UserRecord): UserRow {
  return {
    id: u.id,
    name: u.name,
    email: u.email,
    role: (u.role ?? 'installer') as UserRow['role'],
    companyId: u.companyId,
    companyName: u.companyName,
    active: !u.banned,
    createdAt: u.createdAt.toISOString(),
  };
}
