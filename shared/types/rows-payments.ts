// Row types of the payments area's tables, written by hand to match migrations/.
export {}
