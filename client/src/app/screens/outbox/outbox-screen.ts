import { DatePipe } from '@angular/common';
import { Component, inject } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { OutboxService } from '../../core/outbox.service';
import { TextPart, linkify } from './linkify';

/** Admin: mail the server sent (captured by the development/test SMTP sink), newest first, links clickable. */
@Component({
  selector: 'rn-outbox-screen',
  imports: [DatePipe, RouterLink, MatExpansionModule, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './outbox-screen.html',
  styleUrl: './outbox-screen.scss',
})
export class OutboxScreen {
  private readonly outbox = inject(OutboxService);
  protected readonly mails = rxResource({ stream: () => this.outbox.mails() });

  protected parts(text: string): TextPart[] {
    return linkify(text);
  }

  protected reload(): void {
    this.mails.reload();
  }
}
