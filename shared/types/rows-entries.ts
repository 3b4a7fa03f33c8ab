// Row types of the entries area's tables, written by hand to match migrations/.
export {}
