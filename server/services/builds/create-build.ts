/**
 * Creating a build (api.md `POST /api/builds`): the build, the matches one board carries (each with
 * a snapshot of its design), and, unless asked not to, the reservation and its shortfall list, all
 * in one transaction, so a build is never left half reserved.
 */
import type { Sequelize } from 'sequelize';
import { Build, BuildMatch } from '../../models/index.js';
import { recordAudit } from '../audit.js';
import type { PlanToAllocate } from './allocate-stock.js';
import { reserveBuild } from './reserve-build.js';

/** A build as the route hands it over, its matches already read. */
export interface NewBuild {
  name: string;
  /** Boards. */
  quantity: number;
  /** Reserve at once (default) or leave the build `planned`. */
  reserve: boolean;
  /** The matches one board carries, in the order given. */
  plans: PlanToAllocate[];
}

/** Creates (and normally reserves) a build; returns its id. */
export async function createBuild(sequelize: Sequelize, input: NewBuild, actorId: number | null): Promise<number> {
  return sequelize.transaction(async (transaction) => {
    const build = await Build.create(
      { name: input.name, quantity: input.quantity, status: 'planned', createdBy: actorId, reservedAt: null, builtAt: null, cancelledAt: null },
      { transaction },
    );
    await BuildMatch.bulkCreate(
      input.plans.map((plan, ordinal) => ({ buildId: build.id, matchId: plan.matchId, ordinal, matchName: plan.matchName, design: plan.design })),
      { transaction },
    );
    await recordAudit(
      {
        actorId,
        action: 'build.create',
        entityType: 'build',
        entityId: build.id,
        after: { name: build.name, quantity: build.quantity, matchIds: input.plans.map((p) => p.matchId), status: build.status },
      },
      transaction,
    );
    if (input.reserve) await reserveBuild(sequelize, transaction, build, actorId);
    return build.id;
  });
}
