/** Who is looking at the storefront, as far as choosing an arrangement goes. */
export type Viewer = { kind: "visitor" } | { kind: "not-member"; email: string } | { kind: "customer"; email: string } | { kind: "staff"; email: string };
