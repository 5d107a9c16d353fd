import {
  type CSSVariablesResolver,
  createTheme,
  defaultVariantColorsResolver,
  type MantineColorsTuple,
  rem,
  type VariantColorsResolver,
} from '@mantine/core';

// Crankjournal's own palette: calm greys when normal, colour only for what needs a person.
const copper: MantineColorsTuple = [
  '#e9f4f1',
  '#d3e6e0',
  '#a6cdc1',
  '#76b2a1',
  '#4f9b86',
  '#3a8b75',
  '#2f7b67',
  '#2f6b5e',
  '#245a4e',
  '#174a3f',
];
const brass: MantineColorsTuple = [
  '#fbf5e6',
  '#f3e8c9',
  '#e7d29a',
  '#dbbb69',
  '#d1a842',
  '#c99b2c',
  '#b48a23',
  '#7d5f12',
  '#6a500c',
  '#574108',
];
// Warm iron grey: also Mantine's `gray`, so every stock grey in the app is ours.
const iron: MantineColorsTuple = [
  '#f3f2ee',
  '#e4e2dc',
  '#cfccc3',
  '#b4b0a6',
  '#8f8c84',
  '#6d6b65',
  '#4d4c48',
  '#353533',
  '#2a2b29',
  '#1e1f1e',
];
const amber: MantineColorsTuple = [
  '#fff6e0',
  '#ffebc0',
  '#ffd67f',
  '#ffc04a',
  '#ffaf1f',
  '#f5a000',
  '#d98b00',
  '#8a5700',
  '#744800',
  '#5c3900',
];
const signal: MantineColorsTuple = [
  '#ffeaea',
  '#fdd3d3',
  '#f5a5a5',
  '#ee7575',
  '#e84c4c',
  '#e23434',
  '#c92727',
  '#b01e1e',
  '#961717',
  '#7a0f0f',
];

/**
 * The surfaces and text of each scheme (DESIGN.md palette). Contrast of every text and state colour against these
 * is checked in theme.test.ts; the same values feed the CSS variables below.
 */
export const SCHEME = {
  light: {
    paper: '#ecebe6', // background: warm paper grey
    surface: '#fbfaf6', // cards: off-white
    text: '#1c1b19', // near-black
    quiet: '#4d4c48', // dimmed text (iron 6)
    rule: '#d6d3cb',
    railBg: '#e4e2dc',
    railHover: '#d9d6ce',
    railCurrent: '#fbfaf6',
    brass: '#7d5f12', // brass as text or a thin mark on light (brass 7)
    amber: '#744800', // amber text (amber 8)
    signal: '#b01e1e', // signal red text (signal 7)
    copper: '#2f6b5e', // primary (copper 7)
    ok: '#2f6b5e', // a quiet tick
  },
  dark: {
    paper: '#181917', // deep iron grey
    surface: '#242523', // charcoal
    text: '#e4e0d8', // warm light grey
    quiet: '#a9a59c',
    rule: '#3a3b38',
    railBg: '#1e1f1d',
    railHover: '#2c2d2a',
    railCurrent: '#30312e',
    brass: '#dbbb69', // brass 3
    amber: '#ffaf1f', // amber 4
    signal: '#ee7575', // signal 3
    copper: '#76b2a1', // copper 3, the same green lighter
    ok: '#76b2a1',
  },
} as const;

/** Our own CSS variables (--cj-*) per scheme, and Mantine's body/dimmed pointed at our surfaces. */
export const cssVariablesResolver: CSSVariablesResolver = () => {
  const vars = (s: (typeof SCHEME)['light' | 'dark']) => ({
    '--cj-paper': s.paper,
    '--cj-surface': s.surface,
    '--cj-text': s.text,
    '--cj-text-quiet': s.quiet,
    '--cj-rule': s.rule,
    '--cj-rail-bg': s.railBg,
    '--cj-rail-hover': s.railHover,
    '--cj-rail-current': s.railCurrent,
    '--cj-brass': s.brass,
    '--cj-amber': s.amber,
    '--cj-signal': s.signal,
    '--cj-copper': s.copper,
    '--mantine-color-body': s.surface,
    '--mantine-color-text': s.text,
    '--mantine-color-dimmed': s.quiet,
    '--mantine-color-anchor': s.copper,
  });
  return { variables: {}, light: vars(SCHEME.light), dark: vars(SCHEME.dark) };
};

/** Colours whose fill is bright (amber, brass): their filled badges and buttons use shade 5 with near-black text. */
export const BRIGHT_FILLS = ['amber', 'brass'] as const;

export const variantColorResolver: VariantColorsResolver = (input) => {
  const base = defaultVariantColorsResolver(input);
  if (input.variant === 'filled' && (BRIGHT_FILLS as readonly string[]).includes(input.color ?? '')) {
    return {
      ...base,
      background: `var(--mantine-color-${input.color}-5)`,
      hover: `var(--mantine-color-${input.color}-6)`,
      color: 'var(--mantine-color-black)',
    };
  }
  return base;
};

/** Tablets in the engine house (a coarse pointer) start dark; a person's own choice is remembered by Mantine. */
export function defaultColorScheme(): 'dark' | 'auto' {
  return typeof window !== 'undefined' && window.matchMedia?.('(pointer: coarse)').matches ? 'dark' : 'auto';
}

export const theme = createTheme({
  primaryColor: 'copper',
  primaryShade: { light: 7, dark: 6 },
  // Filled badges and buttons pick dark or light text by the fill's luminance (amber fills take near-black).
  autoContrast: true,
  variantColorResolver,
  white: SCHEME.light.surface,
  black: SCHEME.light.text,
  colors: {
    copper,
    brass,
    iron,
    gray: iron,
    amber,
    signal,
    dark: ['#e4e0d8', '#c9c5bc', '#a9a59c', '#6d6b66', '#4a4947', '#3a3b38', '#2c2d2a', '#242523', '#1e1f1d', '#181917'],
  },
  fontFamily: 'Barlow, system-ui, sans-serif',
  fontFamilyMonospace: 'ui-monospace, monospace',
  headings: { fontFamily: 'Barlow, system-ui, sans-serif', fontWeight: '600' },
  defaultRadius: 'sm',
  fontSizes: { xs: rem(13), sm: rem(15), md: rem(17), lg: rem(19), xl: rem(22) },
  components: {
    Button: { defaultProps: { size: 'md' } },
    TextInput: { defaultProps: { size: 'md' } },
    PasswordInput: { defaultProps: { size: 'md' } },
    NumberInput: { defaultProps: { size: 'md' } },
    Select: { defaultProps: { size: 'md' } },
    Textarea: { defaultProps: { size: 'md' } },
    ActionIcon: { defaultProps: { size: 'xl' } },
    // Links are underlined, so they read without colour (WCAG 1.4.1).
    Anchor: { defaultProps: { underline: 'always' } },
  },
  other: { touchTarget: 48 },
});
