// The whole API's OpenAPI document and an interactive reference for staff developers, served from our
// own origin (swagger-ui-dist from node_modules; no CDN), under the app's Content-Security-Policy.
import { createRequire } from "node:module";
import path from "node:path";
import express, { Router } from "express";
import { requireStaff } from "../../middleware/auth.js";
import { fullOpenApiDocument } from "./openapi-document.js";

const swaggerDir = path.dirname(createRequire(import.meta.url).resolve("swagger-ui-dist/package.json"));

const page = `<!doctype html>
<html lang="en-GB">
<head>
<meta charset="utf-8">
<title>Dewline API reference</title>
<link rel="stylesheet" href="/api/docs/swagger-ui.css">
</head>
<body>
<div id="reference"></div>
<script src="/api/docs/swagger-ui-bundle.js"></script>
<script src="/api/docs/start.js"></script>
</body>
</html>
`;
// A file, not an inline script: the Content-Security-Policy allows scripts from our origin only.
const start = `window.ui = SwaggerUIBundle({ url: "/api/openapi.json", dom_id: "#reference", deepLinking: true });\n`;

/** Mounted at /api after the session and CSRF middleware: `GET /openapi.json` and `/docs`, staff only. */
export function createApiDocsRouter({ appUrl }: { appUrl: string }): Router {
  const router = Router();
  let document: ReturnType<typeof fullOpenApiDocument> | undefined;
  router.get("/openapi.json", requireStaff, (_req, res) => {
    document ??= fullOpenApiDocument(appUrl);
    res.json(document);
  });
  router.get("/docs", requireStaff, (_req, res) => {
    res.type("html").send(page);
  });
  router.get("/docs/start.js", requireStaff, (_req, res) => {
    res.type("js").send(start);
  });
  router.use("/docs", requireStaff, express.static(swaggerDir, { index: false, maxAge: "1h" }));
  return router;
}
