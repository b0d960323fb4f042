import { inject, provideAppInitializer } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';

/**
 * Runnel's own line icons (24×24, stroked with the current colour), registered with MatIconRegistry
 * so `<mat-icon svgIcon="rn:add">` works without any icon font or network request.
 * The markup below is constant and ours, which is what makes bypassing the sanitiser safe.
 */
const STROKE = 'fill="none" stroke="currentColor" stroke-width="2" stroke-linecap="round" stroke-linejoin="round"';

const ICONS: Record<string, string> = {
  runnel: `<path d="M12 3c-3 4.3-5 7.2-5 9.6a5 5 0 0 0 10 0C17 10.2 15 7.3 12 3z"/><path d="M3 20c2 0 2-1.2 4.5-1.2S9.5 20 12 20s2.5-1.2 4.5-1.2S19 20 21 20"/>`,
  menu: `<path d="M4 6h16M4 12h16M4 18h16"/>`,
  add: `<path d="M12 5v14M5 12h14"/>`,
  more: `<circle cx="12" cy="5.5" r="1.2"/><circle cx="12" cy="12" r="1.2"/><circle cx="12" cy="18.5" r="1.2"/>`,
  'sign-out': `<path d="M10 4H5v16h5"/><path d="M14 8l4 4-4 4M18 12H9"/>`,
  team: `<circle cx="9" cy="8.5" r="3"/><path d="M3.5 19c.8-3 2.8-4.5 5.5-4.5s4.7 1.5 5.5 4.5"/><circle cx="16.5" cy="9.5" r="2.5"/><path d="M16 14.5c2.3 0 3.8 1.3 4.5 4"/>`,
  mail: `<rect x="3" y="5.5" width="18" height="13" rx="2"/><path d="M3.5 7l8.5 6.5L20.5 7"/>`,
  projects: `<path d="M3 7a2 2 0 0 1 2-2h4l2 2h8a2 2 0 0 1 2 2v8a2 2 0 0 1-2 2H5a2 2 0 0 1-2-2z"/>`,
  history: `<circle cx="12" cy="12" r="9"/><path d="M12 7v5l3.5 2"/>`,
  edit: `<path d="M4 20h4L19 9l-4-4L4 16z"/><path d="M13.5 6.5l4 4"/>`,
  archive: `<rect x="3" y="4" width="18" height="4" rx="1"/><path d="M5 8v11h14V8M10 12h4"/>`,
  unarchive: `<rect x="3" y="4" width="18" height="4" rx="1"/><path d="M5 8v11h14V8M12 17v-6M9.5 13.5L12 11l2.5 2.5"/>`,
  delete: `<path d="M4 7h16M9 7V4h6v3M6 7l1 13h10l1-13M10 11v6M14 11v6"/>`,
  search: `<circle cx="10.5" cy="10.5" r="6"/><path d="M15 15l5 5"/>`,
  expand: `<path d="M6 9l6 6 6-6"/>`,
  back: `<path d="M19 12H5M11 6l-6 6 6 6"/>`,
  check: `<path d="M5 12.5l4.5 4.5L19 7"/>`,
};

/** Registers the `rn:` icon namespace at start-up. */
export function provideRunnelIcons() {
  return provideAppInitializer(() => {
    const registry = inject(MatIconRegistry);
    const sanitizer = inject(DomSanitizer);
    for (const [name, body] of Object.entries(ICONS)) {
      const svg = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 24 24" ${STROKE}>${body}</svg>`;
      registry.addSvgIconLiteralInNamespace('rn', name, sanitizer.bypassSecurityTrustHtml(svg));
    }
  });
}
