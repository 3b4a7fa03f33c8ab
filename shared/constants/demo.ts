// The demo's published password: every account `npm start` seeds has it. The production start
// (server/plugins/production-start.ts) refuses to run while any account still has it.
export const DEMO_PASSWORD = 'glide-demo-2027'
