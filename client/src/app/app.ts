import { BreakpointObserver } from '@angular/cdk/layout';
import { Component, computed, inject, linkedSignal } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { NavigationEnd, Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { filter, map } from 'rxjs';
import { AppUpdates } from './core/app-updates';
import { SessionService } from './core/session.service';
import { WalkAutoSync } from './core/walk-autosync';

interface NavItem {
  path: string;
  label: string;
  icon: string;
  permission: string;
  testId: string;
}

const NAV: NavItem[] = [
  { path: '/projects', label: 'Projects', icon: 'rn:projects', permission: 'project.read', testId: 'nav-projects' },
  { path: '/team', label: 'Team', icon: 'rn:team', permission: 'team.manage', testId: 'nav-team' },
  { path: '/outbox', label: 'Outbox', icon: 'rn:mail', permission: 'outbox.read', testId: 'nav-outbox' },
  { path: '/audit', label: 'Audit log', icon: 'rn:history', permission: 'audit.read', testId: 'nav-audit' },
];

/** The application frame: toolbar (team and user menus), side navigation, routed screen, safety line. */
@Component({
  selector: 'rn-root',
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatToolbarModule,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatSidenavModule,
    MatListModule,
    MatDividerModule,
    MatTooltipModule,
  ],
  templateUrl: './app.html',
  styleUrl: './app.scss',
})
export class App {
  protected readonly session = inject(SessionService);
  private readonly router = inject(Router);

  protected readonly handset = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 899.98px)')
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  private readonly url = toSignal(
    this.router.events.pipe(
      filter((event): event is NavigationEnd => event instanceof NavigationEnd),
      map((event) => event.urlAfterRedirects),
    ),
    { initialValue: this.router.url },
  );
  private readonly inProject = computed(() => /^\/projects\/[^/]+/.test(this.url()));

  /** Open by default on wide screens outside a project (the Layout canvas wants the width); the user may toggle. */
  protected readonly navOpen = linkedSignal(() => !this.handset() && !this.inProject());
  // session.can() reads the session signal, so the list follows sign-in, sign-out and team switches.
  protected readonly navItems = computed(() => NAV.filter((item) => this.session.can(item.permission)));
  protected readonly teams = computed(() => this.session.me()?.teams ?? []);
  protected readonly initials = computed(() => {
    const name = this.session.me()?.user.name.trim() ?? '';
    const parts = name.split(/\s+/).filter(Boolean);
    return (parts.length > 1 ? parts[0][0] + parts[parts.length - 1][0] : name.slice(0, 2)).toUpperCase() || '?';
  });

  constructor() {
    this.session.load().pipe(takeUntilDestroyed()).subscribe();
    inject(AppUpdates).watch();
    inject(WalkAutoSync).watch();
  }

  protected toggleNav(): void {
    this.navOpen.update((open) => !open);
  }

  protected navigated(): void {
    if (this.handset()) this.navOpen.set(false);
  }

  protected switchTeam(teamId: string): void {
    if (teamId === this.session.me()?.currentTeamId) return;
    this.session.switchTeam(teamId).subscribe(() => void this.router.navigate(['/projects']));
  }

  protected signOut(): void {
    this.session.signOut().subscribe(() => void this.router.navigate(['/sign-in']));
  }
}
