import { Account } from './Account';
import { AuditLog } from './AuditLog';
import { AuthToken } from './AuthToken';
import { Booking } from './Booking';
import { CardCheckout, StripeEvent } from './CardCheckout';
import { CustomerSession, CustomerSignInToken } from './CustomerSession';
import { BookingCrew } from './BookingCrew';
import { BookingLine } from './BookingLine';
import { CalendarFeed } from './CalendarFeed';
import { CompanyClause } from './CompanyClause';
import { Customer } from './Customer';
import { Document } from './Document';
import { FieldPhoto } from './FieldPhoto';
import { DocumentSend } from './DocumentSend';
import { DocumentTemplate } from './DocumentTemplate';
import { ExportRun } from './ExportRun';
import { Invoice } from './Invoice';
import { Item } from './Item';
import { JournalEntry } from './JournalEntry';
import { JournalLine } from './JournalLine';
import { Organization } from './Organization';
import { Payment, PaymentAllocation } from './Payment';
import { Refund, SecurityDepositMove } from './Refund';
import { ReturnCheck, ReturnCheckLine } from './ReturnCheck';
import { Session } from './Session';
import { SignupRequest } from './SignupRequest';
import { Shortfall } from './Shortfall';
import { SiteCheck } from './SiteCheck';
import { SigningEvent } from './SigningEvent';
import { SigningRequest } from './SigningRequest';
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

Document.belongsTo(Booking, { foreignKey: 'bookingId', as: 'booking' });
Document.hasMany(DocumentSend, { foreignKey: 'documentId', as: 'sends' });
SigningRequest.hasMany(SigningEvent, { foreignKey: 'signingRequestId', as: 'events' });
SigningRequest.belongsTo(Document, { foreignKey: 'documentId', as: 'document' });
JournalEntry.hasMany(JournalLine, { foreignKey: 'entryId', as: 'lines' });
JournalLine.belongsTo(Account, { foreignKey: 'accountId', as: 'account' });
// Field operations.
BookingCrew.belongsTo(User, { foreignKey: 'userId', as: 'user' });
ReturnCheck.hasMany(ReturnCheckLine, { foreignKey: 'returnCheckId', as: 'lines' });

export {
  ExportRun,
  BookingCrew, CalendarFeed, FieldPhoto, ReturnCheck, ReturnCheckLine, SiteCheck,
  Invoice, Payment, PaymentAllocation, Refund, SecurityDepositMove,
  CardCheckout, StripeEvent, CustomerSession, CustomerSignInToken,
  Account, AuditLog, AuthToken, Booking, BookingLine, CompanyClause, Customer, Document, DocumentSend, DocumentTemplate, Item, JournalEntry, JournalLine,
  Organization, Session, Shortfall, SigningEvent, SigningRequest, SignupRequest, StoredFile, User,
};
