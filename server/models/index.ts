import { AuditLog } from './AuditLog';
import { AuthToken } from './AuthToken';
import { Organization } from './Organization';
import { Session } from './Session';
import { User } from './User';

User.belongsTo(Organization, { foreignKey: 'organizationId', as: 'organization' });
Session.belongsTo(User, { foreignKey: 'userId', as: 'user' });
AuthToken.belongsTo(User, { foreignKey: 'userId', as: 'user' });

export { AuditLog, AuthToken, Organization, Session, User };
