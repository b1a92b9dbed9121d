// Colours and font of the charts. The SVG from the CLI uses neutral greys (readable in print and on
// either background); the editor panel builds a theme from the editor's own colour variables
// (client/webview/plot-view.ts), so the charts follow the user's colour theme.

export interface PlotTheme {
  background: string;
  foreground: string;
  /** Grid lines and secondary text. */
  muted: string;
  font: string;
  fontSize: number;
  volts: string;
  code: string;
  /** Worst-case band, outer and inner Monte Carlo bands: colour and fill opacity. */
  worst: string;
  worstOpacity: number;
  mcOuter: string;
  mcOuterOpacity: number;
  mcInner: string;
  mcInnerOpacity: number;
  median: string;
  target: string;
  calibration: string;
}

/** Neutral defaults for the SVG written by the CLI. */
export const NEUTRAL_THEME: PlotTheme = {
  background: '#ffffff',
  foreground: '#202020',
  muted: '#8a8a8a',
  font: 'sans-serif',
  fontSize: 11,
  volts: '#202020',
  code: '#202020',
  worst: '#000000',
  worstOpacity: 0.1,
  mcOuter: '#000000',
  mcOuterOpacity: 0.18,
  mcInner: '#000000',
  mcInnerOpacity: 0.3,
  median: '#000000',
  target: '#505050',
  calibration: '#8a8a8a',
};
