import type { ReactNode } from "react";

/** The frame of every Tidemark e-mail: plain, readable in any client, no remote images. */
export function EmailLayout({ title, children, footer }: { title: string; children: ReactNode; footer?: ReactNode }) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <title>{title}</title>
      </head>
      <body style={{ margin: 0, background: "#f7f4ee", color: "#1f2a33", fontFamily: "Helvetica, Arial, sans-serif" }}>
        <table role="presentation" width="100%" cellPadding={0} cellSpacing={0}>
          <tbody>
            <tr>
              <td style={{ padding: "24px" }}>
                <p style={{ margin: "0 0 16px", fontWeight: 700, color: "#0f5e63", letterSpacing: "0.04em" }}>
                  Tidemark
                </p>
                <div style={{ background: "#ffffff", borderRadius: 8, padding: "24px", lineHeight: 1.6 }}>
                  {children}
                </div>
                {footer ? <div style={{ marginTop: 16, fontSize: 12, color: "#5b6770" }}>{footer}</div> : null}
              </td>
            </tr>
          </tbody>
        </table>
      </body>
    </html>
  );
}
