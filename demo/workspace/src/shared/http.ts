// A thin routing layer over node:http. We keep it tiny on purpose: the service has about
// twenty routes and the harbour office laptop must be able to run it without a build farm.

import { createServer, IncomingMessage, ServerResponse, Server } from "node:http";

export interface Request {
  method: string;
  path: string;
  query: URLSearchParams;
  params: Record<string, string>;
  body: unknown;
}

export interface Response {
  status: number;
  body: unknown;
}

export type Handler = (req: Request) => Promise<Response>;

interface Route {
  method: string;
  pattern: RegExp;
  names: string[];
  handler: Handler;
}

export class Router {
  private readonly routes: Route[] = [];

  add(method: string, template: string, handler: Handler): this {
    const names: string[] = [];
    const source = template.replace(/:([a-zA-Z]+)/g, (_, name: string) => {
      names.push(name);
      return "([^/]+)";
    });
    this.routes.push({ method, pattern: new RegExp(`^${source}$`), names, handler });
    return this;
  }

  async dispatch(method: string, url: string, body: unknown): Promise<Response> {
    const parsed = new URL(url, "http://localhost");
    for (const route of this.routes) {
      if (route.method !== method) continue;
      const match = route.pattern.exec(parsed.pathname);
      if (!match) continue;
      const params: Record<string, string> = {};
      route.names.forEach((name, i) => (params[name] = decodeURIComponent(match[i + 1])));
      return route.handler({ method, path: parsed.pathname, query: parsed.searchParams, params, body });
    }
    return { status: 404, body: { error: "not found" } };
  }
}

export function ok(body: unknown): Response {
  return { status: 200, body };
}

export function badRequest(message: string): Response {
  return { status: 400, body: { error: message } };
}

async function readJson(req: IncomingMessage): Promise<unknown> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  if (chunks.length === 0) return undefined;
  return JSON.parse(Buffer.concat(chunks).toString("utf8"));
}

export function serve(router: Router, port: number): Server {
  const server = createServer(async (req: IncomingMessage, res: ServerResponse) => {
    try {
      const body = await readJson(req);
      const result = await router.dispatch(req.method ?? "GET", req.url ?? "/", body);
      res.writeHead(result.status, { "content-type": "application/json" });
      res.end(JSON.stringify(result.body));
    } catch (err) {
      res.writeHead(500, { "content-type": "application/json" });
      res.end(JSON.stringify({ error: (err as Error).message }));
    }
  });
  server.listen(port);
  return server;
}
