import type { ReactElement } from "react";

/**
 * Renders an e-mail component to a complete HTML document. react-dom/server is loaded on demand: Next.js refuses a static
 * import of it inside server code, but e-mails are plain markup rendered once, not pages.
 */
export async function renderEmailHtml(element: ReactElement): Promise<string> {
  const { renderToStaticMarkup } = await import("react-dom/server");
  return `<!DOCTYPE html>${renderToStaticMarkup(element)}`;
}
