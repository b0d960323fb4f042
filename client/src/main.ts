import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app.config';
import { z } from 'zod';

// The CSP forbids eval: zod (the network document's schema) must not try compiling its checks.
z.config({ jitless: true });

bootstrapApplication(App, appConfig).catch((err) => console.error(err));
