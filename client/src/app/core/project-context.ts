import { Injectable, computed, signal } from '@angular/core';
import { Project, UnitSystem } from './api-types';

/**
 * The project open in the project shell, shared with its tab screens.
 * Provided by ProjectShell, so a tab screen may `inject(ProjectContext, { optional: true })`.
 */
@Injectable()
export class ProjectContext {
  private readonly state = signal<Project | null>(null);

  readonly project = this.state.asReadonly();
  /** The project's display unit system; US customary until the project is loaded. */
  readonly units = computed<UnitSystem>(() => this.state()?.units ?? 'us');

  set(project: Project | null): void {
    this.state.set(project);
  }
}
