/**
 * Print CSS for the report page (web only): the app's frame (header, rail, tab bar, buttons) is
 * hidden, the page scrolls as one sheet on white, and panels do not split across pages.
 */
import { useEffect } from 'react';
import { Platform } from 'react-native';

export const PRINT_CSS = `
@media print {
  [role="banner"], [role="navigation"], [role="tablist"], [data-print="hide"] { display: none !important; }
  html, body, #root, #root > div, [role="main"], [data-print="sheet"] { height: auto !important; overflow: visible !important; background: #fff !important; }
  [data-print="sheet"] * { overflow: visible !important; }
  [data-print="keep"], [role="row"], svg { break-inside: avoid; page-break-inside: avoid; }
  [data-print="sheet"] [role="button"], [data-print="sheet"] [role="radiogroup"] { display: none !important; }
  [data-print="sheet"] svg { max-width: 100% !important; height: auto !important; }
  @page { margin: 16mm 14mm; }
}`;

export function usePrintStyle() {
  useEffect(() => {
    if (Platform.OS !== 'web' || typeof document === 'undefined') return;
    const style = document.createElement('style');
    style.setAttribute('data-plumbline', 'report-print');
    style.textContent = PRINT_CSS;
    document.head.appendChild(style);
    return () => style.remove();
  }, []);
}

export function printPage() {
  if (Platform.OS === 'web' && typeof window !== 'undefined') window.print();
}
