import { Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { Observable } from 'rxjs';
import { Project, ProjectPatch, UNIT_SYSTEM_LABELS, UnitSystem } from '../../core/api-types';
import { ProjectsService } from '../../core/projects.service';

export interface ProjectFormData {
  /** Absent: create a new project. Present: edit this one (rename, site, notes, units). */
  project?: Project;
}

/** Create or edit a project; closes with the saved Project, stays open (server message in the snack bar) on failure. */
@Component({
  selector: 'rn-project-form-dialog',
  imports: [ReactiveFormsModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatRadioModule, MatButtonModule, MatProgressBarModule],
  templateUrl: './project-form-dialog.html',
  styleUrl: './project-form-dialog.scss',
})
export class ProjectFormDialog {
  private readonly projects = inject(ProjectsService);
  private readonly dialogRef = inject<MatDialogRef<ProjectFormDialog, Project>>(MatDialogRef);
  protected readonly data = inject<ProjectFormData>(MAT_DIALOG_DATA);

  protected readonly editing = !!this.data.project;
  protected readonly unitChoices = Object.entries(UNIT_SYSTEM_LABELS) as [UnitSystem, string][];
  protected readonly form = inject(NonNullableFormBuilder).group({
    // A name of spaces only is no name: refused here, before the server has to say so.
    name: [this.data.project?.name ?? '', [Validators.required, Validators.pattern(/\S/), Validators.maxLength(200)]],
    siteName: [this.data.project?.siteName ?? '', Validators.maxLength(200)],
    notes: [this.data.project?.notes ?? '', Validators.maxLength(4000)],
    units: [this.data.project?.units ?? ('us' as UnitSystem)],
  });
  protected readonly busy = signal(false);

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    const body = { ...value, name: value.name.trim(), siteName: value.siteName.trim(), notes: value.notes.trim() };
    const original = this.data.project;
    if (original) {
      // Send only what changed, so the audit log and other readers see the real edit.
      const patch: ProjectPatch = {};
      if (body.name !== original.name) patch.name = body.name;
      if (body.siteName !== original.siteName) patch.siteName = body.siteName;
      if (body.notes !== original.notes) patch.notes = body.notes;
      if (body.units !== original.units) patch.units = body.units;
      if (Object.keys(patch).length === 0) {
        this.dialogRef.close(original);
        return;
      }
      this.send(this.projects.update(original.id, patch));
    } else {
      this.send(this.projects.create(body));
    }
  }

  private send(request: Observable<Project>): void {
    this.busy.set(true);
    request.subscribe({
      next: (project) => this.dialogRef.close(project),
      error: () => this.busy.set(false),
    });
  }
}
