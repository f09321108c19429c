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
