import { DatePipe, DecimalPipe } from '@angular/common';
import { HttpClient } from '@angular/common/http';
import { Component, inject, input, resource } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import { SessionService } from '../../core/session.service';

interface ProjectFile { id: string; kind: string; filename: string; mime: string; size: number; createdAt: string; createdBy: string | null }

/** The project's uploads (backdrops, surveys, walk photos): who and when, download, delete. */
@Component({
  selector: 'rn-files-screen',
  imports: [MatTableModule, MatButtonModule, DatePipe, DecimalPipe],
  template: `
    <section class="files" data-testid="files-screen">
      <h2>Files</h2>
      @if (files.hasValue() && files.value().length === 0) { <p>No uploads yet: backdrops and surveys come from the Layout, photos from Walk.</p> }
      @if (files.hasValue() && files.value().length) {
        <table mat-table [dataSource]="files.value()">
          <ng-container matColumnDef="name"><th mat-header-cell *matHeaderCellDef>File</th>
            <td mat-cell *matCellDef="let f"><a [href]="url(f)" download>{{ f.filename }}</a></td></ng-container>
          <ng-container matColumnDef="kind"><th mat-header-cell *matHeaderCellDef>Kind</th><td mat-cell *matCellDef="let f">{{ f.kind }}</td></ng-container>
          <ng-container matColumnDef="size"><th mat-header-cell *matHeaderCellDef>Size</th><td mat-cell *matCellDef="let f">{{ f.size / 1024 | number: '1.0-0' }} KB</td></ng-container>
          <ng-container matColumnDef="who"><th mat-header-cell *matHeaderCellDef>Added</th>
            <td mat-cell *matCellDef="let f">{{ f.createdBy ?? 'unknown' }}, {{ f.createdAt | date: 'medium' }}</td></ng-container>
          <ng-container matColumnDef="actions"><th mat-header-cell *matHeaderCellDef></th>
            <td mat-cell *matCellDef="let f">@if (canWrite()) { <button mat-button (click)="remove(f)" data-testid="file-delete">Delete</button> }</td></ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let row; columns: columns" data-testid="file-row"></tr>
        </table>
      }
    </section>`,
  styles: `.files { padding: 16px; overflow-x: auto; } table { min-width: 560px; }
    /* A phone: one card per file (name, then kind, size, who and when), Delete beside it, nothing off to the right. */
    @media (max-width: 599.98px) {
      .files { overflow: visible; }
      table, .files ::ng-deep tbody { display: block; min-width: 0; }
      tr.mat-mdc-header-row { display: none; }
      tr.mat-mdc-row { display: grid; grid-template-columns: minmax(0, 1fr) auto; column-gap: 8px; height: auto; padding: 8px 0;
        border-bottom: 1px solid var(--mat-sys-outline-variant); }
      td.mat-mdc-cell { display: block; padding: 0; border: 0; min-width: 0; overflow-wrap: anywhere; }
      .mat-column-kind, .mat-column-size, .mat-column-who { grid-column: 1; font: var(--mat-sys-body-small); color: var(--mat-sys-on-surface-variant); }
      .mat-column-actions { grid-column: 2; grid-row: 1 / span 4; align-self: center; }
    }`,
})
export class FilesScreen {
  private readonly http = inject(HttpClient);
  private readonly session = inject(SessionService);
  readonly projectId = input.required<string>();
  readonly columns = ['name', 'kind', 'size', 'who', 'actions'];
  readonly files = resource({
    params: () => this.projectId(),
    loader: ({ params }) => firstValueFrom(this.http.get<ProjectFile[]>(`/api/projects/${encodeURIComponent(params)}/files`)),
  });
  canWrite = () => this.session.can('files.write');
  url = (f: ProjectFile) => `/api/projects/${encodeURIComponent(this.projectId())}/files/${encodeURIComponent(f.id)}`;
  async remove(f: ProjectFile): Promise<void> {
    await firstValueFrom(this.http.delete(this.url(f)));
    this.files.reload();
  }
}
