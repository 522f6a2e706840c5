/** Placeholder replaced by the card module. */
import type { Plan } from "../design/types.js";
export interface CardOptions {
  paper: "a4" | "letter";
  /** Date printed in the footer, YYYY-MM-DD. */
  date: string;
  version: string;
}
export async function renderCard(_plan: Plan, _opts: CardOptions): Promise<Buffer> {
  throw new Error("card not built yet");
}
