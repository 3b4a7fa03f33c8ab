// Row types of the entries area's tables, written by hand to match migrations/.
// (entries, units and firmware_releases are in rows.ts; this area adds no table.)
export {}
