// Row types of the mail area's tables, written by hand to match migrations/.
export {}
