// Accounts, workspaces, memberships, sessions, invitations (owned by the accounts work).
export {};
