import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { ApplicationConfig, provideBrowserGlobalErrorListeners, provideZonelessChangeDetection } from '@angular/core';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS } from '@angular/material/form-field';
import { provideRouter, withComponentInputBinding, withRouterConfig } from '@angular/router';
import { routes } from './app.routes';
import { csrfInterceptor, errorInterceptor } from './core/api-interceptor';
import { provideRunnelServiceWorker } from './core/app-updates';
import { provideRunnelIcons } from './core/icons';

export const appConfig: ApplicationConfig = {
  providers: [
    provideZonelessChangeDetection(),
    provideBrowserGlobalErrorListeners(),
    // errorInterceptor sits outside csrfInterceptor so it sees the outcome after the one CSRF retry.
    provideHttpClient(withInterceptors([errorInterceptor, csrfInterceptor])),
    provideRouter(routes, withComponentInputBinding(), withRouterConfig({ paramsInheritanceStrategy: 'always' })),
    provideRunnelIcons(),
    provideRunnelServiceWorker(),
    { provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: { appearance: 'outline', subscriptSizing: 'dynamic' } },
  ],
};
