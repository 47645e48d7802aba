// Shapes of the API responses the client reads, taken from the shared schemas so client and
// server cannot drift apart (type-only: no validation code ships to the browser from here).
export type { Role } from '@/shared/domain/roles';
export type { Me } from '@/shared/api/auth';
export type { Member, Invite, OutboxMessage, TeamResponse as TeamView, OutboxResponse as OutboxView } from '@/shared/api/team';
export type { AccountResponse as AccountView, NotificationPrefs } from '@/shared/api/account';
export type { AuditEntry, AuditResponse as AuditView } from '@/shared/api/audit';
