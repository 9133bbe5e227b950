import type { User as UserDto } from '../../../shared/api/auth.js';
import type { User } from '../../models/index.js';

/** The public face of a user: never the hash. */
export function presentUser(user: User): UserDto {
  return { id: user.id, email: user.email, name: user.name, role: user.role, active: user.active, passwordSet: user.passwordHash !== null };
}
