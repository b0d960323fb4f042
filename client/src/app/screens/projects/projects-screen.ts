import { DatePipe } from '@angular/common';
import { Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import { catchError, combineLatest, filter, of, switchMap, tap } from 'rxjs';
import { Project, UNIT_SYSTEM_LABELS } from '../../core/api-types';
import { ProjectsService } from '../../core/projects.service';
import { SessionService } from '../../core/session.service';
import { confirmAction } from '../../shared/confirm-dialog';
import { ProjectFormData, ProjectFormDialog } from './project-form-dialog';

/** The team's projects: filter, sort, page; create, edit, archive and delete for those allowed. */
@Component({
  selector: 'rn-projects-screen',
  imports: [
    DatePipe,
    RouterLink,
    MatTableModule,
    MatSortModule,
    MatPaginatorModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatSlideToggleModule,
    MatProgressBarModule,
    MatTooltipModule,
  ],
  templateUrl: './projects-screen.html',
  styleUrl: './projects-screen.scss',
})
export class ProjectsScreen {
  private readonly projectsApi = inject(ProjectsService);
  protected readonly session = inject(SessionService);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly unitLabels = UNIT_SYSTEM_LABELS;
  protected readonly showArchived = signal(false);
  protected readonly filterText = signal('');
  protected readonly projects = signal<Project[]>([]);
  protected readonly loading = signal(true);

  protected readonly noTeam = computed(() => {
    const me = this.session.me();
    return me !== null && !me.currentTeamId;
  });
  // session.can() reads the session signal, so these recompute when the user or team changes.
  protected readonly canCreate = computed(() => this.session.can('project.create'));
  protected readonly canUpdate = computed(() => this.session.can('project.update'));
  protected readonly canDelete = computed(() => this.session.can('project.delete'));
  protected readonly columns = computed(() =>
    this.canUpdate() || this.canDelete() ? ['name', 'siteName', 'units', 'updatedAt', 'actions'] : ['name', 'siteName', 'units', 'updatedAt'],
  );

  protected readonly dataSource = new MatTableDataSource<Project>([]);
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.filterPredicate = (project, text) => [project.name, project.siteName, project.notes].some((field) => field.toLowerCase().includes(text));
    this.dataSource.sortingDataAccessor = (project, column) => {
      if (column === 'updatedAt') return Date.parse(project.updatedAt);
      const value = project[column as keyof Project];
      return typeof value === 'string' ? value.toLowerCase() : String(value);
    };

    // Reload when the team changes (team switcher) or the archived toggle flips; edits update the list in place.
    combineLatest([toObservable(computed(() => this.session.me()?.currentTeamId ?? null)), toObservable(this.showArchived)])
      .pipe(
        tap(([teamId]) => {
          if (teamId === null) this.loading.set(false);
        }),
        filter(([teamId]) => teamId !== null),
        tap(() => this.loading.set(true)),
        switchMap(([, archived]) => this.projectsApi.list({ archived }).pipe(catchError(() => of(null)))),
        takeUntilDestroyed(),
      )
      .subscribe((projects) => {
        this.loading.set(false);
        if (projects) this.projects.set(projects);
      });

    effect(() => (this.dataSource.data = this.projects()));
    effect(() => (this.dataSource.filter = this.filterText().trim().toLowerCase()));
    effect(() => {
      const sort = this.sort();
      const paginator = this.paginator();
      if (sort) this.dataSource.sort = sort;
      if (paginator) this.dataSource.paginator = paginator;
    });
  }

  protected onFilter(event: Event): void {
    this.filterText.set((event.target as HTMLInputElement).value);
  }

  protected unitsOf(project: Project): string {
    return this.unitLabels[project.units] ?? project.units;
  }

  protected open(project: Project): void {
    void this.router.navigate(['/projects', project.id, 'layout']);
  }

  protected create(): void {
    this.dialog
      .open<ProjectFormDialog, ProjectFormData, Project>(ProjectFormDialog, { data: {}, width: '520px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((project) => {
        if (project) void this.router.navigate(['/projects', project.id, 'layout']);
      });
  }

  protected edit(project: Project): void {
    this.dialog
      .open<ProjectFormDialog, ProjectFormData, Project>(ProjectFormDialog, { data: { project }, width: '520px', maxWidth: '95vw' })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) this.replace(saved);
      });
  }

  protected setArchived(project: Project, archived: boolean): void {
    this.projectsApi.archive(project.id, archived).subscribe((saved) => {
      if (!archived || this.showArchived()) this.replace(saved);
      else this.projects.update((list) => list.filter((p) => p.id !== saved.id));
      const ref = this.snackBar.open(`“${saved.name}” ${archived ? 'archived' : 'restored'}.`, archived ? 'Undo' : undefined, { duration: 6000 });
      if (archived) ref.onAction().subscribe(() => this.setArchived(saved, false));
    });
  }

  protected remove(project: Project): void {
    confirmAction(this.dialog, {
      title: 'Delete project?',
      message: `“${project.name}” and its design, files and history will be deleted for everyone in the team. This cannot be undone; archiving keeps it instead.`,
      confirmLabel: 'Delete project',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.projectsApi.delete(project.id)),
      )
      .subscribe(() => {
        this.projects.update((list) => list.filter((p) => p.id !== project.id));
        this.snackBar.open(`“${project.name}” deleted.`, undefined, { duration: 4000 });
      });
  }

  private replace(saved: Project): void {
    this.projects.update((list) => list.map((p) => (p.id === saved.id ? saved : p)));
  }
}
