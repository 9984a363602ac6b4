/**
 * Demo shops and their people. Every name, company and address is invented; e-mail domains
 * use the reserved `.example` top-level domain (RFC 2606), so no message can reach anyone.
 */

/** Password of every demo account (demo data only, never a real deployment). */
export const DEMO_PASSWORD = "faradsmith-demo-2026";

export type DemoShopSlug = "kestrel-bank-works" | "marlow-pulse";

export type DemoPerson = { name: string; email: string };

export type DemoShopPeople = {
  manager: DemoPerson;
  estimator: DemoPerson;
  customers: [DemoPerson, DemoPerson];
};

export type DemoShop = {
  slug: DemoShopSlug;
  name: string;
  /** ISO 4217 code */
  currency: "EUR" | "GBP";
  tagline: string;
  description: string;
};

export const demoShops: DemoShop[] = [
  {
    slug: "kestrel-bank-works",
    name: "Kestrel Bank Works",
    currency: "EUR",
    tagline: "Supercapacitor modules built to your voltage, energy and ride-through time.",
    description:
      "Kestrel Bank Works assembles EDLC and hybrid lithium-ion capacitor modules for " +
      "ride-through, backup power and regenerative braking, from graded cells kept in stock, " +
      "with active balancing fitted and every module tested for capacitance and ESR before it ships.",
  },
  {
    slug: "marlow-pulse",
    name: "Marlow Pulse",
    currency: "GBP",
    tagline: "High-voltage film and electrolytic banks for pulsed power and DC links.",
    description:
      "Marlow Pulse builds polypropylene film and aluminium electrolytic capacitor banks up to " +
      "several kilovolts for pulsed-power rigs, DC links and discharge work, with bleeder " +
      "resistors, shrouded terminals and a shorting link supplied with every bank.",
  },
];

export const demoPeople: Record<DemoShopSlug, DemoShopPeople> = {
  "kestrel-bank-works": {
    manager: { name: "Ottilie Brandvold", email: "ottilie.brandvold@kestrel-bank-works.example" },
    estimator: { name: "Casimir Oyelaran", email: "casimir.oyelaran@kestrel-bank-works.example" },
    customers: [
      { name: "Renske Haddow", email: "renske.haddow@tollmere-tramways.example" },
      { name: "Joaquim Pellow", email: "joaquim.pellow@quenby-hoists.example" },
    ],
  },
  "marlow-pulse": {
    manager: { name: "Hollis Achterberg", email: "hollis.achterberg@marlow-pulse.example" },
    estimator: { name: "Noor Castellane", email: "noor.castellane@marlow-pulse.example" },
    customers: [
      { name: "Teodor Smallbrook", email: "teodor.smallbrook@ondrel-laser-labs.example" },
      { name: "Mina Rookwood", email: "mina.rookwood@fennick-magnetics.example" },
    ],
  },
};
