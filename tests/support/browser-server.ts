import { chromium, type BrowserServer } from 'playwright-core';
import type { TestProject } from 'vitest/node';
import { CHROMIUM_ARGS, chromiumPath } from './browser';

/**
 * Global setup of the browser tests: one Chromium for the whole run, which every test file
 * connects to (`launchBrowser`) and in which each test opens contexts of its own (their own
 * cookies and storage), instead of every file starting and stopping a Chromium of its own.
 */

declare module 'vitest' {
  export interface ProvidedContext {
    /** Where the run's shared Chromium listens (tests/support/browser-server.ts). */
    chromiumWsEndpoint: string;
  }
}

let server: BrowserServer | undefined;

export async function setup(project: TestProject) {
  server = await chromium.launchServer({ executablePath: chromiumPath(), headless: true, args: CHROMIUM_ARGS });
  project.provide('chromiumWsEndpoint', server.wsEndpoint());
}

export async function teardown() {
  await server?.close();
}
