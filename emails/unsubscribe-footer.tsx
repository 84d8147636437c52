/** The footer of every message a person can turn off: what it is and a one-click way to stop it. */
export function UnsubscribeFooter({ what, url, settingsUrl }: { what: string; url: string; settingsUrl: string }) {
  return (
    <>
      You receive {what} because they are on in your Tidemark settings.{" "}
      <a href={url} style={{ color: "#5b6770" }}>
        Turn off {what}
      </a>{" "}
      ·{" "}
      <a href={settingsUrl} style={{ color: "#5b6770" }}>
        All e-mail settings
      </a>
    </>
  );
}

export function unsubscribeText(what: string, url: string, settingsUrl: string): string {
  return [
    `You receive ${what} because they are on in your Tidemark settings.`,
    `Turn off ${what}: ${url}`,
    `All e-mail settings: ${settingsUrl}`,
  ].join("\n");
}
