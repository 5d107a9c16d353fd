import { darken, DEFAULT_THEME, luminance, mergeMantineTheme } from '@mantine/core';
import { BRIGHT_FILLS, SCHEME, theme, variantColorResolver } from './theme';

// WCAG 2.2, success criteria 1.4.3 (contrast, minimum: 4.5:1 for text) and 1.4.11 (non-text contrast: 3:1),
// with the relative luminance and contrast ratio as defined in the WCAG 2.2 glossary (W3C Recommendation, 2023).
function ratio(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('contrast of the theme (WCAG AA)', () => {
  it('computes the contrast ratio of the WCAG examples', () => {
    expect(ratio('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(ratio('#777777', '#ffffff')).toBeCloseTo(4.48, 2);
  });

  it('fills amber and brass with shade 5 and near-black text', () => {
    const full = mergeMantineTheme(DEFAULT_THEME, theme);
    const v = variantColorResolver({ color: 'amber', variant: 'filled', theme: full });
    expect(v.background).toBe('var(--mantine-color-amber-5)');
    expect(v.color).toBe('var(--mantine-color-black)');
    expect(variantColorResolver({ color: 'signal', variant: 'filled', theme: full }).color).toBe('var(--mantine-color-white)');
  });

  for (const scheme of ['light', 'dark'] as const) {
    const s = SCHEME[scheme];
    for (const ground of ['paper', 'surface', 'railBg', 'railCurrent'] as const) {
      for (const ink of ['text', 'quiet', 'amber', 'signal', 'copper', 'ok'] as const) {
        it(`${scheme}: ${ink} text on ${ground} is at least 4.5:1`, () => {
          expect(ratio(s[ink], s[ground])).toBeGreaterThanOrEqual(4.5);
        });
      }
      it(`${scheme}: the brass mark on ${ground} is at least 3:1`, () => {
        expect(ratio(s.brass, s[ground])).toBeGreaterThanOrEqual(3);
      });
    }

    // Badges and buttons, as Mantine 9 builds its variant colours (get-css-color-variables): in light, filled and
    // outline use the shade of primaryShade.light and light uses shade 9 on shade 1; in dark, filled uses
    // primaryShade.dark, outline that minus 4, light shade 0 on shade 9 darkened by half. Bright fills: shade 5.
    const shade = (theme.primaryShade as { light: number; dark: number })[scheme];
    for (const colour of ['copper', 'signal', 'amber', 'brass', 'gray'] as const) {
      const tuple = theme.colors![colour]!;
      const bright = (BRIGHT_FILLS as readonly string[]).includes(colour);
      it(`${scheme}: text on a filled ${colour} is at least 4.5:1`, () => {
        const fill = tuple[bright ? 5 : shade];
        const ink = bright || luminance(fill) > 0.3 ? theme.black! : theme.white!;
        expect(ratio(ink, fill)).toBeGreaterThanOrEqual(4.5);
      });
      for (const ground of ['paper', 'surface'] as const) {
        it(`${scheme}: an outlined ${colour} on ${ground} is at least 4.5:1`, () => {
          expect(ratio(tuple[scheme === 'light' ? shade : shade - 4], s[ground])).toBeGreaterThanOrEqual(4.5);
        });
      }
      it(`${scheme}: a light ${colour} badge is at least 4.5:1`, () => {
        const [ink, fill] = scheme === 'light' ? [tuple[9], tuple[1]] : [tuple[0], darken(tuple[9], 0.5)];
        expect(ratio(ink, fill)).toBeGreaterThanOrEqual(4.5);
      });
    }
  }
});
