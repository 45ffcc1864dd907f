import GlobalStyles from '@mui/material/GlobalStyles';

/**
 * The Baseline step as a one-page baseline sheet on paper: no app bar, footer, steps or buttons;
 * fork and shock side by side, shorter charts (the table's colour marks are their key), the order
 * of work in two columns, the cautions kept whole. "What we assumed" stays on screen.
 */
export function BaselinePrintStyles() {
  return (
    <GlobalStyles
      styles={{
        '@media print': {
          '@page': { size: 'A4', margin: '8mm 10mm' },
          html: { fontSize: '10px' },
          body: { background: '#fff !important', printColorAdjust: 'exact', WebkitPrintColorAdjust: 'exact' },
          '.no-print, .sheet-assumed': { display: 'none !important' },
          '.print-only': { display: 'block !important' },
          main: { padding: '0 !important' },
          '.MuiContainer-root': {
            maxWidth: 'none !important',
            padding: '0 !important',
            minHeight: '0 !important',
          },
          '.baseline-sheet': { gap: '6px !important' },
          '.baseline-sheet > *': { margin: '0 !important' },
          '.baseline-sheet .MuiCard-root': {
            border: '1px solid #bbb',
            boxShadow: 'none',
            breakInside: 'avoid',
          },
          '.baseline-sheet .MuiCardContent-root': { padding: '6px 8px !important' },
          '.baseline-sheet .MuiCardContent-root > .MuiStack-root': { gap: '4px !important' },
          '.baseline-sheet .MuiCardContent-root > .MuiStack-root > *': { margin: '0 !important' },
          '.baseline-sheet .MuiTypography-h3': { fontSize: '1.2rem !important' },
          '.sheet-parts, .sheet-pump-parts': {
            gridTemplateColumns: '1fr 1fr !important',
            gap: '6px !important',
          },
          '.sheet-parts > :only-child, .sheet-pump-parts > :only-child': { gridColumn: '1 / -1' },
          '.spring-chart .MuiChartsLegend-root, .sheet-screen-only': { display: 'none !important' },
          '.sheet-bottoms, .sheet-mark': { display: 'inline !important', marginLeft: '4px' },
          '.sheet-figures': { gridTemplateColumns: '1fr 1fr 1fr !important', gap: '4px !important' },
          '.sheet-figures .MuiTypography-overline': { lineHeight: '1.2 !important' },
          '.sheet-inputs dl': { gridTemplateColumns: 'auto 1fr auto 1fr !important' },
          '.sheet-inputs': { padding: '4px 8px !important', border: '1px solid #bbb !important' },
          '.sheet-cautions': {
            padding: '4px 8px !important',
            breakInside: 'avoid',
            borderWidth: '1px !important',
          },
          '.sheet-cautions li, .sheet-pump li': {
            marginBottom: '0 !important',
            fontSize: '0.95rem !important',
          },
          '.sheet-how-to': { padding: '4px 8px !important' },
          '.sheet-how-to ol': { columns: 2, columnGap: '16px' },
          '.sheet-note': { fontSize: '0.85rem !important', lineHeight: '1.3 !important' },
          '.MuiTableCell-root': { padding: '0 4px !important', fontSize: '0.9rem !important' },
          '.MuiAlert-root': { padding: '0 8px !important', fontSize: '0.9rem !important' },
          '.MuiAlert-icon': { display: 'none !important' },
          '.baseline-sheet li, .baseline-sheet .MuiAlert-message, .baseline-sheet .MuiTypography-body2': {
            lineHeight: '1.3 !important',
          },
          '.MuiAlert-message': { padding: '2px 0 !important' },
        },
      }}
    />
  );
}
