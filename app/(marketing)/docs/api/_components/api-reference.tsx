"use client";
import { useEffect, useRef, useState } from "react";
import "swagger-ui-dist/swagger-ui.css";
import "./api-reference.css";

type SwaggerUIBundle = (options: Record<string, unknown>) => unknown;

/**
 * The operations, rendered in the browser by Swagger UI from /api/v1/openapi.json. Its script and
 * stylesheet ship with the app (swagger-ui-dist, bundled with this page's chunk, which carries the
 * request's CSP nonce); it loads no fonts and nothing from another origin. "Try it out" calls this
 * server with the visitor's own session.
 */
export function ApiReference() {
  const root = useRef<HTMLDivElement>(null);
  const [failed, setFailed] = useState(false);
  useEffect(() => {
    let cancelled = false;
    import("swagger-ui-dist/swagger-ui-bundle.js")
      .then((mod: { default?: SwaggerUIBundle } & Partial<{ SwaggerUIBundle: SwaggerUIBundle }>) => {
        const bundle = (mod.default ?? mod.SwaggerUIBundle) as SwaggerUIBundle;
        if (cancelled || !root.current) return;
        bundle({
          domNode: root.current,
          url: "/api/v1/openapi.json",
          deepLinking: true,
          docExpansion: "list",
          defaultModelsExpandDepth: 0,
          validatorUrl: "none",
          tryItOutEnabled: false,
          supportedSubmitMethods: ["get", "post"],
        });
      })
      .catch(() => setFailed(true));
    return () => {
      cancelled = true;
    };
  }, []);
  return (
    <div className="rounded-lg bg-white ring-1 ring-ink-100">
      {failed ? (
        <p role="alert" className="p-4 text-sm text-danger-700">
          The reference could not be shown here; the description itself is at <a href="/api/v1/openapi.json">/api/v1/openapi.json</a>.
        </p>
      ) : null}
      <div ref={root} data-testid="api-reference" />
    </div>
  );
}
