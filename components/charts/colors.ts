/**
 * Chart colours (the Tailwind palette's ember, frost, flag, moss and inks), in a plain module so
 * that server components and the pages' first-load JavaScript can use them without recharts.
 */
export const CHART_COLORS = { ember: "#e0591b", frost: "#1f7a99", flag: "#b42323", moss: "#2f7a3b", ink: "#3d4656", muted: "#5f6878", line: "#d9d2c5" };
