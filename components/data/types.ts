// Shapes of the auth/team API responses as the client reads them (the contract in the server's
// shared schemas); kept to what screens use so a server-side addition never breaks the client.
export const ROLE_NAMES = ['admin', 'designer', 'reviewer', 'educator', 'viewer'] as const;
export type Role = (typeof ROLE_NAMES)[number];

export type Me = {
  user: { id: string; email: string; name: string };
  team: { id: string; name: string };
  role: Role;
  teams: { id: string; name: string; role: Role }[];
};

export type Member = { userId: string; email: string; name: string; role: Role; joinedAt: string };
export type Invite = { id: string; email: string; role: Role; expiresAt: string };
export type TeamView = { team: { id: string; name: string }; members: Member[]; invites: Invite[] };

export type NotificationPrefs = { reviewRequests: boolean; decisions: boolean };
export type AccountView = { user: { id: string; email: string; name: string }; notifications: NotificationPrefs };

export type OutboxMessage = { id: string; to: string; subject: string; text: string; html?: string | null; receivedAt: string };
export type OutboxView = { messages: OutboxMessage[] };

export type AuditEntry = { id: string; at: string; actor: string | null; action: string; target: string | null; details: unknown };
export type AuditView = { entries: AuditEntry[] };
