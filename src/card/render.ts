/**
 * The PDF job card: `renderCard(plan, opts)` draws a finished plan, section by section in the
 * order templates/card-layout.json lists them, and puts the footer (job id, page x of y, date,
 * armwind version) on every page. It reads nothing but the layout file and the fonts, and writes
 * nothing: the CLI writes the returned bytes.
 */
import type { Plan } from "../design/types.js";
import { cardLayout, type CardLayout, type Paper, type SectionName } from "./layout.js";
import { Sheet, type CardContext } from "./sheet.js";
import { jobPage } from "./pages/job.js";
import { stepsPage } from "./pages/steps.js";
import { orderPage } from "./pages/order.js";
import { diagramPage } from "./pages/diagram.js";
import { benchPage } from "./pages/bench.js";
import { curvesPage, candidatesPage } from "./pages/curves.js";
import { cautionsPage } from "./pages/cautions.js";

export interface CardOptions {
  paper: Paper;
  /** Date printed in the footer, YYYY-MM-DD. */
  date: string;
  version: string;
  /** Shop, bench, meter and spool from the shop profile. */
  context?: CardContext;
  /** Layout data other than templates/card-layout.json (a shop trying a look; tests). */
  layout?: CardLayout;
}

const BUILDERS: Record<SectionName, (s: Sheet, plan: Plan) => void> = {
  job: jobPage,
  order: orderPage,
  steps: stepsPage,
  diagram: diagramPage,
  bench: benchPage,
  curves: curvesPage,
  candidates: candidatesPage,
  cautions: cautionsPage,
};

export async function renderCard(plan: Plan, opts: CardOptions): Promise<Buffer> {
  const L = opts.layout ?? cardLayout();
  // the footer date also stamps the PDF, so the same plan and date give the same card
  const when = /^\d{4}-\d{2}-\d{2}$/.test(opts.date) ? new Date(`${opts.date}T00:00:00Z`) : new Date(0);
  const s = new Sheet(L, opts.paper, {
    Title: `${plan.job.id}: ${plan.job.title}`,
    Subject: "armature rewind job card",
    Creator: `armwind ${opts.version}`,
    Producer: `armwind ${opts.version}`,
    CreationDate: when,
    ModDate: when,
  });
  s.context = opts.context ?? {};
  for (const section of L.sections) BUILDERS[section](s, plan);
  s.footers(plan.job.id, opts.date, opts.version);
  return s.finish();
}
