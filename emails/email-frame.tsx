import { Body, Container, Head, Html, Preview } from "@react-email/components";
import type { ReactNode } from "react";
import { COPPER, INK_100, INK_900, PAPER } from "./theme";

/**
 * The frame every message shares: the preview line an inbox shows, the paper background and the
 * white card with the copper rule. Templates put their heading, text and buttons inside.
 */
export function EmailFrame({ preview, children }: { preview: string; children: ReactNode }) {
  return (
    <Html lang="en">
      <Head />
      <Preview>{preview}</Preview>
      <Body style={{ backgroundColor: PAPER, color: INK_900, fontFamily: "'IBM Plex Sans', Arial, Helvetica, sans-serif", margin: 0, padding: "24px 0" }}>
        <Container
          style={{
            backgroundColor: "#ffffff",
            border: `1px solid ${INK_100}`,
            borderTop: `4px solid ${COPPER}`,
            borderRadius: 6,
            maxWidth: 560,
            padding: "28px 32px",
          }}
        >
          {children}
        </Container>
      </Body>
    </Html>
  );
}
