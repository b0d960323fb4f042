import { bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { appConfig } from './app/app.config';

// zod's no-eval setting for the CSP is made where documents are parsed (core/document-parse.ts and
// the workers), so that zod is not part of the first download.
bootstrapApplication(App, appConfig).catch((err) => console.error(err));
