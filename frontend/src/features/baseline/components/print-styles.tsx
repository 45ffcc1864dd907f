import GlobalStyles from '@mui/material/GlobalStyles';

/**
 * The Baseline step as a one-page baseline sheet on paper: no app bar, footer, steps or buttons;
 * the parts side by side, a shorter chart, the cautions kept whole.
 */
export function BaselinePrintStyles() {
  return (
    <GlobalStyles
      styles={{
        '@media print': {
          '@page': { size: 'A4', margin: '10mm' },
          html: { fontSize: '11px' },
          body: { background: '#fff !important', printColorAdjust: 'exact', WebkitPrintColorAdjust: 'exact' },
          '.no-print': { display: 'none !important' },
          '.print-only': { display: 'block !important' },
          main: { padding: '0 !important' },
          '.MuiContainer-root': { maxWidth: 'none !important', padding: '0 !important' },
          '.baseline-sheet': { gap: '8px !important' },
          '.baseline-sheet > *': { margin: '0 !important' },
          '.baseline-sheet .MuiCard-root': {
            border: '1px solid #ccc',
            boxShadow: 'none',
            breakInside: 'avoid',
          },
          '.baseline-sheet .MuiCardContent-root': { padding: '8px 10px !important' },
          '.baseline-sheet .MuiCardContent-root > .MuiStack-root': { gap: '6px !important' },
          '.baseline-sheet .MuiCardContent-root > .MuiStack-root > *': { margin: '0 !important' },
          '.sheet-parts': { gridTemplateColumns: '1fr 1fr !important', gap: '8px !important' },
          '.sheet-parts > :only-child': { gridColumn: '1 / -1' },
          '.spring-chart': { height: '190px', overflow: 'hidden' },
          '.spring-chart .MuiChartsWrapper-root, .spring-chart svg': { maxHeight: '190px' },
          '.sheet-inputs': { padding: '6px 10px !important', border: '1px solid #ccc !important' },
          '.sheet-cautions': { padding: '6px 10px !important', breakInside: 'avoid' },
          '.sheet-cautions li, .sheet-pump li': { marginBottom: '1px !important' },
          '.sheet-assumed': { display: 'none !important' },
          '.MuiTypography-h3': { fontSize: '1.15rem !important' },
          '.MuiTableCell-root': { padding: '1px 4px !important', fontSize: '0.85rem' },
          '.MuiAlert-root': { padding: '0 8px !important' },
        },
      }}
    />
  );
}
