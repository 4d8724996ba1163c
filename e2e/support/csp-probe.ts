import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { ConsoleMessage, Page } from '@playwright/test';

/**
 * Tools to watch the content security policy from inside Chromium: every `securitypolicyviolation`
 * event of every document and frame of a page, the console lines in which the browser reports a
 * refusal, and small HTTP servers on other loopback ports (other origins) that log what reaches them.
 */

export interface Violation {
  /** the directive that refused the load (`script-src-elem`, `connect-src`, ...) */
  effectiveDirective: string;
  blockedURI: string;
  documentURI: string;
  disposition: string;
}

export interface CspWatch {
  violations: Violation[];
  /** console lines that mention the policy or a refusal by it */
  consoleLines: string[];
}

/** Chromium writes a refusal as "Refused to ... because it violates the following Content Security Policy directive". */
const CSP_CONSOLE_LINE = /Content Security Policy|Refused to (load|connect|frame|execute|evaluate|apply|send form)/i;

/**
 * Starts recording violations on `page` (before its first navigation). The listener is added to each
 * new document before the app's own scripts run, so nothing the app does at start-up is missed.
 * Dedicated workers get no listener (init scripts do not run in them): their refusals are caught as
 * console lines, and a page that needs its worker shows it worked.
 */
export async function watchCsp(page: Page): Promise<CspWatch> {
  const watch: CspWatch = { violations: [], consoleLines: [] };
  await page.exposeFunction('__coupletCspViolation', (violation: Violation) => {
    watch.violations.push(violation);
  });
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      const report = (window as unknown as { __coupletCspViolation: (v: unknown) => void }).__coupletCspViolation;
      report({ effectiveDirective: event.effectiveDirective, blockedURI: event.blockedURI, documentURI: event.documentURI, disposition: event.disposition });
    });
  });
  const onConsole = (message: ConsoleMessage) => {
    if (CSP_CONSOLE_LINE.test(message.text())) watch.consoleLines.push(message.text());
  };
  page.on('console', onConsole);
  // A worker's own refusals do not reach the document's listener; its console does reach us.
  page.on('worker', (worker) => worker.on('console', onConsole));
  return watch;
}

export interface LoggingServer {
  /** `http://127.0.0.1:<port>` */
  origin: string;
  /** method and path (with query) of every request received */
  requests: string[];
  close(): Promise<void>;
}

type Route = (request: http.IncomingMessage) => { type: string; body: string } | undefined;

/**
 * An HTTP server on a free loopback port — another origin than the app's — that logs every request.
 * Its answers allow any origin (CORS), so only the app's policy can stand between a page and them.
 */
export async function startLoggingServer(route: Route = () => undefined): Promise<LoggingServer> {
  const requests: string[] = [];
  const server = http.createServer((request, response) => {
    requests.push(`${request.method} ${request.url}`);
    request.resume();
    const answer = route(request) ?? { type: 'text/plain', body: 'ok' };
    response.writeHead(200, { 'Content-Type': answer.type, 'Access-Control-Allow-Origin': '*', 'Cache-Control': 'no-store' });
    response.end(answer.body);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return {
    origin: `http://127.0.0.1:${port}`,
    requests,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
