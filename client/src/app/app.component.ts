import { Component } from '@angular/core';
import { MatToolbarModule } from '@angular/material/toolbar';

@Component({
  selector: 'rn-root',
  imports: [MatToolbarModule],
  template: `<mat-toolbar>Runnel</mat-toolbar>`,
})
export class AppComponent {}
