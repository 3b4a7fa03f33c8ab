// Row types of the setup area's tables, written by hand to match migrations/.
export {}
