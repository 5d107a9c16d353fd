import { createTheme, type MantineColorsTuple, rem } from '@mantine/core';

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
  '#9c771b',
  '#866513',
  '#6f530b',
];
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
  '#b37100',
  '#8f5a00',
  '#6b4300',
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

export const theme = createTheme({
  primaryColor: 'copper',
  primaryShade: { light: 7, dark: 4 },
  colors: {
    copper,
    brass,
    iron,
    amber,
    signal,
    dark: ['#d9d6cf', '#b8b5ae', '#8f8c85', '#6d6b66', '#4a4947', '#353533', '#2a2b29', '#222322', '#1b1c1b', '#151615'],
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
  },
  other: { touchTarget: 48 },
});
