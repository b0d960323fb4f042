import { Injectable, computed, signal } from '@angular/core';
import { Project, UnitSystem } from './api-types';

/**
 * The project open in the project shell, shared with its tab screens.
 * Provided by ProjectShell, so a tab screen may `inject(ProjectContext, { optional: true })`.
 */
@Injectable()
export class ProjectContext {
  private readonly state = signal<Project | null>(null);
  /** The viewer's own choice from the project page's unit switch (null: the project's setting). */
  private readonly viewUnits = signal<UnitSystem | null>(null);

  readonly project = this.state.asReadonly();
  /** The display unit system: the viewer's switch, else the project's; US customary until loaded. */
  readonly units = computed<UnitSystem>(() => this.viewUnits() ?? this.state()?.units ?? 'us');

  set(project: Project | null): void {
    if (project?.id !== this.state()?.id) this.viewUnits.set(project ? readViewUnits(project.id) : null);
    this.state.set(project);
  }

  /** Show this project in `units` on this device (kept per project in local storage). */
  setViewUnits(units: UnitSystem): void {
    const project = this.state();
    this.viewUnits.set(units);
    if (project) {
      try {
        localStorage.setItem(storageKey(project.id), units);
      } catch {
        /* private mode: the switch still works for this visit */
      }
    }
  }
}

const storageKey = (projectId: string) => `runnel.units.${projectId}`;

function readViewUnits(projectId: string): UnitSystem | null {
  try {
    const v = localStorage.getItem(storageKey(projectId));
    return v === 'us' || v === 'si' ? v : null;
  } catch {
    return null;
  }
}
