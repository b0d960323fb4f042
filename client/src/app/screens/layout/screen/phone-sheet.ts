import { effect, signal, untracked } from '@angular/core';

/**
 * On a phone the side panel (properties and results) is a bottom sheet under the canvas
 * (layout-phone.scss): a handle opens and closes it, and selecting an element opens it so its
 * properties show. On wider screens the handle is hidden and the panel is always beside the canvas.
 * Create in an injection context (a component field).
 */
export class PhoneSheet {
  private readonly openState = signal(false);
  readonly open = this.openState.asReadonly();

  constructor(selection: () => readonly string[]) {
    effect(() => {
      if (selection().length > 0) untracked(() => this.openState.set(true));
    });
  }

  toggle(): void {
    this.openState.update((o) => !o);
  }
}
