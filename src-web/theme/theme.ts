import { createDarkTheme, createLightTheme, type BrandVariants, type Theme } from '@fluentui/react-components';

/** Yokeline's own brand ramp: verdigris through deep teal (the colour of weathered copper). */
export const verdigris: BrandVariants = {
  10: '#031312',
  20: '#072321',
  30: '#0a302d',
  40: '#0c3d39',
  50: '#0e4a45',
  60: '#105852',
  70: '#12665f',
  80: '#15756c',
  90: '#2a8279',
  100: '#429087',
  110: '#5a9e95',
  120: '#72aca3',
  130: '#8bbab2',
  140: '#a4c9c1',
  150: '#bed7d1',
  160: '#d8e6e2',
};

/** The copper accent, used sparingly: the active navigation mark, focus of attention. */
export const copper = { light: '#b4652e', dark: '#d98c55' };

const fontFamily = "'Open Sans', 'Segoe UI', system-ui, -apple-system, sans-serif";

function finish(t: Theme): Theme {
  return {
    ...t,
    fontFamilyBase: fontFamily,
    borderRadiusMedium: '6px',
    borderRadiusLarge: '10px',
  };
}

const darkBase = createDarkTheme(verdigris);
export const lightTheme: Theme = finish(createLightTheme(verdigris));
export const darkTheme: Theme = finish({
  ...darkBase,
  // Lift the brand foreground in dark mode so links and selected states stay readable.
  colorBrandForeground1: verdigris[120],
  colorBrandForeground2: verdigris[130],
  colorNeutralBackground1: '#141a19',
  colorNeutralBackground2: '#182120',
  colorNeutralBackground3: '#1d2726',
});

/** Status colours follow the trade: green accepted, amber pending/hold, red rejected. */
export const statusColours = {
  light: { ok: '#1d7a3e', pending: '#9a5b00', bad: '#b3261e', info: verdigris[80] },
  dark: { ok: '#5cc583', pending: '#f0b35a', bad: '#ff8a80', info: verdigris[120] },
};

/**
 * Control-chart colours (Drift watch): the plotted line in verdigris, limits in copper, zones as
 * verdigris tints that deepen toward the centre, flags in the trade's red with a diamond shape.
 */
export const chartColours = {
  light: { line: verdigris[80], center: verdigris[40], limit: copper.light, zoneA: '#b4652e12', zoneB: '#42908718', zoneC: '#42908726', flag: statusColours.light.bad, grid: '#dfe6e4', axis: '#56625f', spec: '#7a4a9c', bar: verdigris[100], background: '#ffffff', text: '#1d2422' },
  dark: { line: verdigris[130], center: verdigris[150], limit: copper.dark, zoneA: '#d98c5516', zoneB: '#8bbab21c', zoneC: '#8bbab22c', flag: statusColours.dark.bad, grid: '#2b3634', axis: '#a9b6b3', spec: '#c9a3e6', bar: verdigris[110], background: '#141a19', text: '#e4ecea' },
};
