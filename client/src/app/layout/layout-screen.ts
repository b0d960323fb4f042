import { Component, input } from '@angular/core';

/** STUB — the Layout canvas editor. */
@Component({
  selector: 'rn-layout-screen',
  template: `<p>Layout for project {{ projectId() }} is being built.</p>`,
})
export class LayoutScreen {
  readonly projectId = input.required<string>();
}
