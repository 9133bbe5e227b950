/** Admin use cases on users: list, create, change; every change is audited in its transaction. */
import type { Sequelize } from 'sequelize';
import { UniqueConstraintError } from 'sequelize';
import type { CreateUserRequest, UpdateUserRequest } from '../../../shared/api/auth.js';
import { User } from '../../models/index.js';
import { conflict, notFound, badRequest } from '../../errors.js';
import { recordAudit } from '../audit.js';
import { hashPassword } from './password.js';
import { presentUser } from './present-user.js';

/** All users, by e-mail. */
export async function listUsers() {
  const users = await User.findAll({ order: [['email', 'ASC']] });
  return users.map(presentUser);
}

/** Creates a user, with a first password or none (then they set one from an invitation); 409 when the e-mail is taken. */
export async function createUser(sequelize: Sequelize, actorId: number | null, input: CreateUserRequest) {
  // No password: nobody can sign in as this user until they set one from an invitation link.
  const passwordHash = input.password === undefined ? null : await hashPassword(input.password);
  try {
    return await sequelize.transaction(async (transaction) => {
      const user = await User.create(
        { email: input.email.trim().toLowerCase(), name: input.name.trim(), role: input.role, passwordHash },
        { transaction },
      );
      await recordAudit({ actorId, action: 'user.create', entityType: 'user', entityId: user.id, after: presentUser(user) }, transaction);
      return presentUser(user);
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) {
      throw conflict(`A user with e-mail ${input.email} already exists.`, [{ field: 'email', message: 'already in use' }]);
    }
    throw error;
  }
}

/** Changes role, name or active flag; an admin may not demote or deactivate themself. */
export async function updateUser(sequelize: Sequelize, actorId: number, id: number, input: UpdateUserRequest) {
  return sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) throw notFound(`User ${id}`);
    if (id === actorId && ((input.role && input.role !== 'admin') || input.active === false)) {
      throw badRequest('You cannot remove your own admin role or deactivate yourself; ask another admin.', [
        { field: input.active === false ? 'active' : 'role', message: 'not allowed on your own account' },
      ]);
    }
    const before = presentUser(user);
    if (input.role !== undefined) user.role = input.role;
    if (input.active !== undefined) user.active = input.active;
    if (input.name !== undefined) user.name = input.name.trim();
    await user.save({ transaction });
    const after = presentUser(user);
    await recordAudit({ actorId, action: 'user.update', entityType: 'user', entityId: id, before, after }, transaction);
    return after;
  });
}
