/** A team's price list as the API sends it (server/API.md "Price list of the current team"): one wire type for server/prices/price-store.ts and the Takeoff screen. */
export interface PriceItem {
  id: string;
  /** The takeoff item code (`pe-sidr9/1"`, `tee/1"`, `other/trenching`). */
  code: string;
  description: string;
  unit: string;
  /** Unit price in the team's currency; null = not priced yet. */
  price: number | null;
  updatedAt: string;
  /** Name of the user who saved last. */
  updatedBy: string | null;
}
