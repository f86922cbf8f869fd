/**
 * A small static file server for dist/ (used by `npm start` over https and by the
 * browser tests over http on a free loopback port). Serves only files inside the root.
 */
import * as fs from "fs";
import * as http from "http";
import * as https from "https";
import * as path from "path";

const TYPES: Record<string, string> = {
  ".html": "text/html; charset=utf-8",
  ".js": "text/javascript; charset=utf-8",
  ".json": "application/json; charset=utf-8",
  ".xml": "application/xml; charset=utf-8",
  ".png": "image/png",
  ".map": "application/json; charset=utf-8",
  ".css": "text/css; charset=utf-8",
};

export interface ServerOptions {
  root: string;
  port: number;
  host?: string;
  tls?: { key: Buffer; cert: Buffer };
}

export function serveStatic(options: ServerOptions): Promise<http.Server> {
  const root = path.resolve(options.root);
  const handler = (req: http.IncomingMessage, res: http.ServerResponse) => {
    const url = new URL(req.url ?? "/", "http://localhost");
    let rel = decodeURIComponent(url.pathname);
    if (rel.endsWith("/")) rel += "preview.html";
    const file = path.resolve(root, "." + rel);
    if (!file.startsWith(root + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
      res.writeHead(404, { "content-type": "text/plain" });
      res.end("not found");
      return;
    }
    res.writeHead(200, {
      "content-type": TYPES[path.extname(file)] ?? "application/octet-stream",
      "cache-control": "no-store",
      "access-control-allow-origin": "*",
    });
    fs.createReadStream(file).pipe(res);
  };
  const server = options.tls ? https.createServer(options.tls, handler) : http.createServer(handler);
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, options.host ?? "127.0.0.1", () => resolve(server));
  });
}
