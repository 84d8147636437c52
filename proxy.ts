import { NextResponse, type NextRequest } from "next/server";

/**
 * Content security policy with a fresh nonce per request (Next.js reads the nonce from the request's policy and puts it on
 * its own scripts, https://nextjs.org/docs/app/guides/content-security-policy): only this site's scripts and the
 * inline scripts Next.js writes run, never an injected one, so no 'unsafe-inline' for scripts. React still sets inline
 * style attributes, hence 'unsafe-inline' for styles. Nothing may be loaded from or posted to elsewhere, nor framed.
 */
export function contentSecurityPolicy(nonce: string, dev: boolean): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${dev ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self' data:",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const policy = contentSecurityPolicy(nonce, process.env.NODE_ENV !== "production");
  const headers = new Headers(request.headers);
  headers.set("x-nonce", nonce);
  headers.set("content-security-policy", policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set("content-security-policy", policy);
  return response;
}

export const config = {
  matcher: [
    {
      // Pages only: not the API, not built assets, not prefetches (their pages get their own nonce when shown).
      source: "/((?!api|_next/static|_next/image|icon.svg|favicon.ico|robots.txt|manifest.webmanifest).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
