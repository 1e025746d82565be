/** The demo workspace's sign-in, printed by `npm start`. Invented; development installs only. */
export const DEMO_ACCOUNT = {
  email: 'demo@lariat.localhost',
  password: 'lariat-demo-2026',
  name: 'Demo Analyst',
  workspace: 'Harbour Creamery (demo)',
} as const;
