/** Binds every model to one Sequelize instance. Models hold schema only; services hold behaviour. */
import type { Sequelize } from 'sequelize';
import { User } from './user.js';
import { AuditEntry } from './audit-entry.js';
import { Part } from './part.js';
import { StockImport } from './stock-import.js';
import { StockImportChange } from './stock-import-change.js';
import { OutboundMail } from './outbound-mail.js';
import { UserToken } from './user-token.js';
import { Build } from './build.js';
import { BuildMatch } from './build-match.js';
import { Reservation } from './reservation.js';
import { ShortfallList } from './shortfall-list.js';
import { ShortfallLine } from './shortfall-line.js';
import { Match } from './match.js';
import { OrganisationSetting } from './organisation-setting.js';

export { User, AuditEntry };
export { Part, StockImport, StockImportChange };
export { OutboundMail, UserToken };
export { Build, BuildMatch, Reservation, ShortfallList, ShortfallLine };
export { Match, OrganisationSetting };

/** Initialises all models on `sequelize` (call once per instance, before the first query). */
export function initModels(sequelize: Sequelize): void {
  User.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  Part.initModel(sequelize);
  StockImport.initModel(sequelize);
  StockImportChange.initModel(sequelize);
  OutboundMail.initModel(sequelize);
  UserToken.initModel(sequelize);
  Build.initModel(sequelize);
  BuildMatch.initModel(sequelize);
  Reservation.initModel(sequelize);
  ShortfallList.initModel(sequelize);
  ShortfallLine.initModel(sequelize);
  Match.initModel(sequelize);
  OrganisationSetting.initModel(sequelize);
}
