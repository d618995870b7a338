import { provideBrowserGlobalErrorListeners, provideZonelessChangeDetection } from '@angular/core';
import { bootstrapApplication } from '@angular/platform-browser';
import { BlankApp } from './blank-app';

// The baseline of `npm run bench:ui`: what Angular and one Material button cost before any Rimelog code.
bootstrapApplication(BlankApp, {
  providers: [provideBrowserGlobalErrorListeners(), provideZonelessChangeDetection()],
}).catch((error: unknown) => console.error(error));
