/** Binds every model to one Sequelize instance. Models hold schema only; services hold behaviour. */
import type { Sequelize } from 'sequelize';
import { User } from './user.js';
import { AuditEntry } from './audit-entry.js';
import { Part } from './part.js';
import { StockImport } from './stock-import.js';
import { StockImportChange } from './stock-import-change.js';
import { OutboundMail } from './outbound-mail.js';
import { UserToken } from './user-token.js';

export { User, AuditEntry };
export { Part, StockImport, StockImportChange };
export { OutboundMail, UserToken };

/** Initialises all models on `sequelize` (call once per instance, before the first query). */
export function initModels(sequelize: Sequelize): void {
  User.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  Part.initModel(sequelize);
  StockImport.initModel(sequelize);
  StockImportChange.initModel(sequelize);
  OutboundMail.initModel(sequelize);
  UserToken.initModel(sequelize);
}
