// Light or dark: the Office theme when Excel reports one, else the system's colour scheme.
// The palette itself is in styles.css (:root and :root[data-theme='dark']).
import type { OfficeTheme } from '../src/hosts/index.js';

/** Relative luminance of "#rrggbb" (WCAG 2.x definition), 1 for anything unreadable. */
function luminance(hex: string): number {
  const m = /^#?([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex.trim());
  if (!m) return 1;
  const [r, g, b] = m.slice(1).map((h) => {
    const c = parseInt(h, 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

export function applyTheme(office?: OfficeTheme): void {
  const root = document.documentElement;
  if (office) {
    root.dataset.theme = luminance(office.background) < 0.2 ? 'dark' : 'light';
    root.style.setProperty('--bg', office.background);
    root.style.setProperty('--fg', office.foreground);
    return;
  }
  const dark = window.matchMedia('(prefers-color-scheme: dark)');
  const follow = () => (root.dataset.theme = dark.matches ? 'dark' : 'light');
  follow();
  dark.addEventListener('change', follow);
}
