import { AuditLog } from './AuditLog';
import { AuthToken } from './AuthToken';
import { Booking } from './Booking';
import { BookingLine } from './BookingLine';
import { Customer } from './Customer';
import { Item } from './Item';
import { Organization } from './Organization';
import { Session } from './Session';
import { Shortfall } from './Shortfall';
import { StoredFile } from './StoredFile';
import { User } from './User';

User.belongsTo(Organization, { foreignKey: 'organizationId', as: 'organization' });
Session.belongsTo(User, { foreignKey: 'userId', as: 'user' });
AuthToken.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Customer.belongsTo(StoredFile, { foreignKey: 'exemptionCertificateId', as: 'exemptionCertificate' });
Booking.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' });
Booking.hasMany(BookingLine, { foreignKey: 'bookingId', as: 'lines' });
BookingLine.belongsTo(Booking, { foreignKey: 'bookingId', as: 'booking' });
BookingLine.belongsTo(Item, { foreignKey: 'itemId', as: 'item' });

export { AuditLog, AuthToken, Booking, BookingLine, Customer, Item, Organization, Session, Shortfall, StoredFile, User };
