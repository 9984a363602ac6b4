import { Button, Heading, Hr, Text } from "@react-email/components";
import { COPPER, INK_100, INK_600, INK_900 } from "./theme";
import { EmailFrame } from "./email-frame";

export interface AccountExistsEmailProps {
  /** the address the form was filled in with (the one this message goes to) */
  email: string;
  /** what was asked for: an account at this shop's storefront, or a new shop */
  attempt: { kind: "join"; shopName: string } | { kind: "open-shop"; shopName: string };
  /** the sign-in page, set to come back to where the person was going */
  signInUrl: string;
}

export const accountExistsSubject = (p: Pick<AccountExistsEmailProps, "attempt">) =>
  p.attempt.kind === "join" ? `You already have an account — ${p.attempt.shopName}` : "You already have an account — opening a shop";

/**
 * "You already have an account": sent when the join or open-a-shop form is filled in with an
 * e-mail that has an account. The page answers as for a new address (so nobody learns from it
 * which addresses have accounts); this message tells the owner what happened and where to sign in.
 */
export function AccountExistsEmail({ email, attempt, signInUrl }: AccountExistsEmailProps) {
  const what = attempt.kind === "join" ? `create a customer account at ${attempt.shopName}` : `open a new shop, ${attempt.shopName}`;
  return (
    <EmailFrame preview={`You already have a Faradsmith account with ${email}; nothing new was created.`}>
      <Heading as="h1" style={{ fontSize: 22, lineHeight: "30px", margin: "0 0 16px" }}>
        You already have an account
      </Heading>
      <Text style={para}>
        Someone, we hope you, used this address ({email}) to {what}. There is already a Faradsmith account with this address, so nothing new was created and
        your account is unchanged.
      </Text>
      <Text style={para}>
        {attempt.kind === "join"
          ? "Sign in with your existing password and you can join the shop from its storefront in one click."
          : "Sign in with your existing password first; to open a shop under another account, use another e-mail address."}
      </Text>
      <Button
        href={signInUrl}
        style={{ backgroundColor: INK_900, borderRadius: 4, color: "#ffffff", fontSize: 15, fontWeight: 600, margin: "8px 0 16px", padding: "12px 20px" }}
      >
        Sign in
      </Button>
      <Text style={{ color: INK_600, fontSize: 13, lineHeight: "20px", margin: "0 0 8px" }}>
        Or open this address:{" "}
        <a href={signInUrl} style={{ color: COPPER }}>
          {signInUrl}
        </a>
      </Text>
      <Hr style={{ borderColor: INK_100, margin: "20px 0" }} />
      <Text style={{ color: INK_600, fontSize: 12, lineHeight: "18px", margin: 0 }}>
        If this was not you, you need do nothing: no account was created and nobody was signed in.
      </Text>
    </EmailFrame>
  );
}

const para = { fontSize: 15, lineHeight: "22px", margin: "0 0 14px" } as const;

export default AccountExistsEmail;
