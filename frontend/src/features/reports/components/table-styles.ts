/**
 * Report tables on a phone: MUI's 16 px cell padding left four columns wider than a 390 px screen
 * (the Difference column was cut off and the page scrolled sideways). Tighter cells below `sm`.
 */
export const compactCells = { '& .MuiTableCell-root': { px: { xs: 0.75, sm: 2 } } } as const;
