import { Component, input } from '@angular/core';

/** Stands in for a project tab that is not built yet; title and purpose come from the route's data. */
@Component({
  selector: 'rn-placeholder-screen',
  template: `
    <section class="rn-placeholder" data-testid="placeholder-screen">
      <h2>{{ screenTitle() }}</h2>
      <p class="rn-not-built">Not built yet.</p>
      <p class="rn-muted">{{ purpose() }}</p>
    </section>
  `,
  styles: `
    .rn-placeholder { max-width: 640px; margin: 48px auto; padding: 0 24px; text-align: center; }
    h2 { font: var(--mat-sys-title-large); margin: 0 0 8px; }
    .rn-not-built { font: var(--mat-sys-title-medium); color: var(--mat-sys-tertiary); margin: 0 0 8px; }
  `,
})
export class PlaceholderScreen {
  readonly screenTitle = input('This screen');
  readonly purpose = input('');
}
