// Row types of the files area's tables, written by hand to match migrations/.
export {}
