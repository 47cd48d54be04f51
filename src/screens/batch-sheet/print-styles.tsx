import { useEffect } from 'react';
import { Platform } from 'react-native';

/**
 * Print layout on the web: the page flows over as many sheets as it needs (A4 or Letter, whichever the
 * printer has), controls are left off, and the caution banner stays. Elements whose testID starts with
 * "no-print" are hidden in print.
 */
const PRINT_CSS = `
@page { margin: 12mm; }
@media print {
  html, body, #root, #root div { height: auto !important; max-height: none !important; overflow: visible !important; }
  body { background: #fff !important; }
  [data-testid^="no-print"] { display: none !important; }
  [data-testid="caution-banner"] { display: flex !important; break-inside: avoid; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  [data-testid="sheet-line"] { break-inside: avoid; }
  [data-testid="sheet-sign-off"] { break-inside: avoid; }
}
`;

export function PrintStyles() {
  useEffect(() => {
    if (Platform.OS !== 'web' || typeof document === 'undefined') return;
    const el = document.createElement('style');
    el.setAttribute('data-troughline', 'print');
    el.textContent = PRINT_CSS;
    document.head.appendChild(el);
    return () => el.remove();
  }, []);
  return null;
}
