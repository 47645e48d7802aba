// SWR keys are the API paths they fetch; kept in one place so mutations revalidate the right data.
export const ME_KEY = '/api/auth/me';
export const TEAM_KEY = '/api/team';
export const ACCOUNT_KEY = '/api/account';
export const OUTBOX_KEY = '/api/team/outbox';
export const AUDIT_KEY = '/api/audit';
