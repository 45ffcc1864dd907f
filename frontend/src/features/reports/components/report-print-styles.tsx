import GlobalStyles from '@mui/material/GlobalStyles';

/**
 * The rider's report on paper: no app bar, footer or buttons; black on white; tables and charts
 * kept (a chart is not split across pages).
 */
export function ReportPrintStyles() {
  return (
    <GlobalStyles
      styles={{
        '@media print': {
          '@page': { size: 'A4', margin: '10mm' },
          'html, body': { background: '#fff !important', color: '#000 !important' },
          body: { printColorAdjust: 'exact', WebkitPrintColorAdjust: 'exact' },
          'header, nav, footer, .no-print, .report-no-print, .MuiButton-root, .MuiIconButton-root': {
            display: 'none !important',
          },
          '.MuiContainer-root': { maxWidth: 'none !important', padding: '0 !important' },
          '.MuiCard-root, .MuiPaper-root': {
            boxShadow: 'none !important',
            border: '1px solid #999 !important',
            background: '#fff !important',
            breakInside: 'avoid',
          },
          '.MuiTypography-root, .MuiTableCell-root, .MuiAlert-root, a': { color: '#000 !important' },
          '.MuiAlert-root': { background: '#fff !important', border: '1px solid #999' },
          '.report-run, .report-chart, .report-table, .report-photos li': { breakInside: 'avoid' },
          '.report-chart svg': { overflow: 'visible' },
        },
      }}
    />
  );
}
