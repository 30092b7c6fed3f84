/** Customer kinds and field limits: the customer form and the schemas share them. */
export const CUSTOMER_KINDS = ["company", "owner_operator"] as const;
export type CustomerKind = (typeof CUSTOMER_KINDS)[number];

export const CUSTOMER_KIND_LABELS: Record<CustomerKind, string> = {
  company: "Company",
  owner_operator: "Owner-operator",
};

export const CUSTOMER_LIMITS = { name: 120, notes: 4000, phone: 30, email: 200, contacts: 50, search: 120 } as const;
