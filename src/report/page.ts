/** The report page: self-contained HTML with inline SVG and CSS. Pure: input → { html, figures }. */
import { bifacialPitchFigure, bifacialTiltFigure } from "./bifacialFigures.js";
import { html, escapeText } from "./escape.js";
import {
  convergenceFigure,
  iamFigure,
  monthlyFigure,
  optimumFigures,
  spectralCorrectionFigure,
  parameterSweepFigure,
  tiltFigure,
  yieldLabel,
  type Figure,
} from "./figures.js";
import type { BenefitRow, BifacialRow, OptimumEntry, ReportInput, StackEntry } from "./inputs.js";
import { ledgerFigure, responseMapFigure, spectralStripsFigure } from "./stackFigures.js";
import { escapeAngleFigure, generationFigure, passesFigure } from "./trappingFigures.js";
import { REPORT_CSS } from "./style.js";

export interface RenderedReport {
  html: string;
  figures: Figure[];
}

/** At most this many stacks get their own spectral plot and map (a sweep can have hundreds). */
export const MAX_STACK_SECTIONS = 12;

/** Above this share of the photocurrent left at the bounce limit, the breakdown carries a warning. */
export const UNRESOLVED_WARN_FRACTION = 0.01;

function fmt(v: number | undefined, digits = 2): string {
  return v === undefined || !Number.isFinite(v) ? "–" : v.toFixed(digits);
}

/** Charges: whole A·h/m² once they are large, one decimal below 1000. */
function fmtCharge(v: number | undefined): string {
  return fmt(v, v !== undefined && Math.abs(v) >= 1000 ? 0 : 1);
}

function figureHtml(f: Figure): string {
  const width = /^<svg[^>]* width="(\d+(?:\.\d+)?)"/.exec(f.svg)?.[1] ?? "720";
  return `<figure data-figure="${escapeText(f.id)}" style="width:${width}px">${f.svg}<figcaption>${html`${f.title} — `}<a href="${escapeText(f.id)}.svg">${escapeText(f.id)}.svg</a></figcaption></figure>`;
}

function note(text: string): string {
  return html`<p class="note">${text}</p>`;
}

/** A warning when much of the light was still travelling at the event limit (absorber current a lower bound). */
function unresolvedNote(stack: StackEntry, angleDeg: number): string {
  const at = stack.photocurrent?.perAngle.find((a) => Math.abs(a.thetaDeg - angleDeg) < 1e-6);
  const unresolved = at?.losses.find((l) => l.channel === "unresolved");
  if (!at || !unresolved) return "";
  const total = at.absorberMaCm2 + at.losses.reduce((s, l) => s + l.currentMaCm2, 0);
  if (!(total > 0 && unresolved.currentMaCm2 / total > UNRESOLVED_WARN_FRACTION)) return "";
  return note(`${fmt((100 * unresolved.currentMaCm2) / total, 1)} % of the incident photocurrent was still travelling when rays reached the per-ray event limit (channel "unresolved"): that light is neither absorbed nor lost, so the absorber current is a lower bound.`);
}

function summaryTable(input: ReportInput): string {
  let body = "";
  for (const s of input.stacks) {
    const m = s.matrix;
    const pc = s.photocurrent;
    const j0 = pc?.perAngle.find((a) => Math.abs(a.thetaDeg) < 1e-6);
    const ja = pc?.perAngle.find((a) => Math.abs(a.thetaDeg - input.angleDeg) < 1e-6);
    const rays = m.nRays.length ? m.nRays.reduce((a, b) => a + b, 0) : 0;
    body += html`<tr><td class="text">${s.label}</td><td class="text"><code>${s.matrixPath}</code></td><td>${m.thetaDeg.length} × ${m.phiDeg.length} × ${m.wavelengthNm.length}</td><td>${rays.toExponential(2)}</td>`;
    body += `<td>${j0 ? `${fmt(j0.absorberMaCm2)} ± ${fmt(j0.absorberStderrMaCm2, 3)}` : "–"}</td>`;
    body += input.angleDeg !== 0 ? `<td>${ja ? `${fmt(ja.absorberMaCm2)} ± ${fmt(ja.absorberStderrMaCm2, 3)}` : "–"}</td>` : "";
    body += "</tr>";
  }
  const angleHead = input.angleDeg !== 0 ? html`<th>J at ${input.angleDeg}° (mA/cm²)</th>` : "";
  return `<table class="summary"><thead><tr><th class="text">stack</th><th class="text">matrix file</th><th>θ × φ × λ points</th><th>rays traced</th><th>J at 0° (mA/cm²)</th>${angleHead}</tr></thead><tbody>${body}</tbody></table>`;
}

function benefitTable(rows: BenefitRow[]): string {
  let body = "";
  for (const r of rows) {
    body += html`<tr><td class="text">${r.siteName}</td><td>${fmt(r.tiltDeg, 0)}</td><td>${fmt(r.azimuthDeg, 0)}</td><td class="text">${r.stackA}</td><td class="text">${r.stackB}</td><td>${fmtCharge(r.annualAhM2A)}</td><td>${fmtCharge(r.annualAhM2B)}</td>`;
    body += `<td><strong>${r.benefitPct >= 0 ? "+" : ""}${fmt(r.benefitPct)}</strong></td><td>${fmt(r.stderrPct, 2)}</td><td class="text">${r.errorKind ?? "–"}</td></tr>`;
  }
  return `<table class="benefit"><thead><tr><th class="text">site</th><th>tilt (°)</th><th>azimuth (°)</th><th class="text">stack A</th><th class="text">stack B</th><th>A (A·h/m²)</th><th>B (A·h/m²)</th><th>A vs B (%)</th><th>± s.e. (%)</th><th class="text">s.e. from</th></tr></thead><tbody>${body}</tbody></table>`;
}

function bifacialTable(rows: BifacialRow[]): string {
  let body = "";
  for (const r of rows) {
    body += html`<tr><td class="text">${r.stackLabel}, ${r.siteName}</td><td>${r.tiltDeg}</td><td>${r.pitchM === null ? "isolated" : r.pitchM.toFixed(2)}</td><td>${r.groundCoverageRatio.toFixed(2)}</td><td>${fmtCharge(r.frontAhM2)}</td><td>${fmtCharge(r.rearAhM2)}</td><td>${fmtCharge(r.totalAhM2)}</td><td>${r.gainPct.toFixed(2)} ± ${r.gainStdErrPct.toFixed(2)}</td></tr>`;
  }
  const b = rows[0]!.opticalBifaciality;
  return `<table class="bifacial"><caption>${html`optical bifaciality (rear / front photocurrent at 0°, AM1.5G): ${b.toFixed(3)}`}</caption><thead><tr><th class="text">stack, site</th><th>tilt (°)</th><th>pitch (m)</th><th>GCR</th><th>front (A·h/m²)</th><th>rear (A·h/m²)</th><th>total (A·h/m²)</th><th>gain (%)</th></tr></thead><tbody>${body}</tbody></table>`;
}

function yieldTable(input: ReportInput): string {
  let body = "";
  for (const y of input.yields) {
    body += html`<tr><td class="text">${yieldLabel(y, input.yields)}</td><td>${fmtCharge(y.annualAhM2)}</td><td>${fmt(y.poaKwhM2, 0)}</td><td>${fmt(y.relativeToNormal === undefined ? undefined : 100 * y.relativeToNormal, 1)}</td></tr>`;
  }
  return `<table class="yield"><thead><tr><th class="text">stack, tilt</th><th>year (A·h/m²)</th><th>plane-of-array (kWh/m²)</th><th>vs normal incidence (%)</th></tr></thead><tbody>${body}</tbody></table>`;
}

/** Optimum of one optimisation: each parameter with its interval and bound flag, then the objective. */
function optimumTable(o: OptimumEntry): string {
  const pct = `${Math.round(o.level * 100)} %`;
  const sig = (v: number, se: number) => v.toFixed(se > 0 ? Math.max(0, Math.min(8, 1 - Math.floor(Math.log10(se)))) : 3);
  let body = "";
  o.parameters.forEach((p, d) => {
    const se = o.locationStdErr[d]!;
    const [lo, hi] = o.locationInterval[d]!;
    body += html`<tr><td class="text"><code>${p.path}</code></td><td>${p.lower}–${p.upper} ${p.unit}</td><td><strong>${sig(o.location[d]!, se)}</strong></td><td>${sig(lo, se)} – ${sig(hi, se)}</td><td class="text">${o.atBound[d] ? `at the ${o.atBound[d]} bound: the optimum may lie beyond it` : ""}</td></tr>`;
  });
  body += html`<tr class="total"><td class="text">${o.objectiveName} (${o.unit})</td><td></td><td><strong>${sig(o.value, o.valueStdErr)}</strong></td><td>${sig(o.valueInterval[0], o.valueStdErr)} – ${sig(o.valueInterval[1], o.valueStdErr)}</td><td class="text">${`± ${sig(o.valueStdErr, o.valueStdErr)} s.e.`}</td></tr>`;
  const caption = html`${o.studyName}: maximise ${o.description}`;
  return `<table class="optimum"><caption>${caption}</caption><thead><tr><th class="text">parameter</th><th>bounds</th><th>optimum</th><th>${pct} interval</th><th class="text">note</th></tr></thead><tbody>${body}</tbody></table>`;
}

/** Renders the whole page and returns it with the figures (each also written as its own SVG). */
export function renderReport(input: ReportInput): RenderedReport {
  const figures: Figure[] = [];
  const use = (f: Figure) => {
    figures.push(f);
    return figureHtml(f);
  };
  let sections = "";

  // Overview
  sections += `<section id="overview"><h2>Stacks</h2>`;
  for (const n of input.notes) sections += note(n);
  sections += input.stacks.length ? summaryTable(input) : note("No response matrix was found in the run directory.");
  sections += `</section>`;

  // Photon ledger: from the incident photon current to the absorber current, then per wavelength
  sections += `<section id="ledger"><h2>Photon ledger</h2>`;
  sections += html`<p class="lead">At θ = ${input.angleDeg}°: the photon current the spectrum brings over the matrix's wavelengths, what each loss takes in the order the light meets it, and what the absorber keeps (mA/cm²); below, where each wavelength ends up, one strip per channel.</p>`;
  const shown = input.stacks.slice(0, MAX_STACK_SECTIONS);
  if (shown.length === 0) sections += note("Omitted: no response matrix.");
  shown.forEach((s, i) => {
    sections += html`<h3>${s.label}</h3>`;
    sections += unresolvedNote(s, input.angleDeg);
    const led = ledgerFigure(s, i, input.angleDeg);
    sections += led ? use(led) : note("No photocurrent summary for this stack (photocurrent.json missing), so no ledger in mA/cm².");
    sections += use(spectralStripsFigure(s, i, input.angleDeg));
  });
  if (input.stacks.length > shown.length) sections += note(`Only the first ${MAX_STACK_SECTIONS} of ${input.stacks.length} stacks are plotted.`);
  sections += `</section>`;

  // Light trapping: passes per stack, generation profiles
  const passes = shown.map((s, i) => passesFigure(s, i, input.angleDeg)).filter((f): f is Figure => f !== null);
  const generation = generationFigure(input.generations ?? []);
  const escape = escapeAngleFigure(shown, input.angleDeg);
  sections += `<section id="trapping"><h2>Light trapping and generation</h2>`;
  sections += html`<p class="lead">The front loss in the ledger comes in two parts: light reflected before it ever entered the absorber (what anti-reflection can win) and light that entered and escaped again (what light trapping can win). Of the light that entered, the plots show the fraction still inside after each pass (one traversal between the faces) at θ = ${input.angleDeg}° for the long wavelengths, and the generation profile G(z) written by the generation command.</p>`;
  if (passes.length === 0) sections += note("Passes omitted: the matrices carry no light-trapping tallies (format version 1: rerun the sweep).");
  sections += `<div class="row">${passes.map(use).join("")}${escape ? use(escape) : ""}</div>`;
  sections += generation ? use(generation) : note("Generation profile omitted: no generation/generation.json in the run (made by `lightfold generation <study> --out <run>/generation`).");
  sections += `</section>`;

  // Parameter sweep (only when a study sweeps parameters)
  const sweepFig = parameterSweepFigure(input.stacks, input.angleDeg);
  if (sweepFig) {
    sections += `<section id="parameter-sweep"><h2>Parameter sweep</h2>`;
    sections += `<p class="lead">Absorber photocurrent of every combination of the swept study parameters; the highest is circled.</p>`;
    sections += use(sweepFig) + `</section>`;
  }

  // Design optimum (only with optimum.json from `lightfold optimize`)
  if (input.optima.length > 0) {
    sections += `<section id="optimum"><h2>Design optimum</h2>`;
    sections += `<p class="lead">The parameter value that maximises the objective within its bounds. The search ran on one random stream (every evaluation traces the same rays, so differences are smooth); the interval comes from a polynomial fitted around the optimum on independent replicas (Student's t over their optima).</p>`;
    input.optima.forEach((o, i) => {
      sections += optimumTable(o);
      sections += note(`${o.cost.evaluations} evaluations, ${o.cost.raysTraced.toExponential(2)} rays traced in ${o.cost.wallS.toFixed(1)} s.`);
      sections += `<div class="row">${optimumFigures(o, i).map(use).join("")}</div>`;
    });
    sections += `</section>`;
  }

  // Angular response
  sections += `<section id="angular"><h2>Angular response</h2>`;
  sections += `<p class="lead">Absorber absorptance over incidence angle and wavelength, and the angular modifier of the absorber photocurrent.</p>`;
  sections += `<div class="row">`;
  shown.forEach((s, i) => {
    sections += use(responseMapFigure(s, i));
  });
  const iam = iamFigure(input.stacks.slice(0, MAX_STACK_SECTIONS));
  sections += iam ? use(iam) : note("Angular modifier omitted: no photocurrent summary (photocurrent.json) in the run.");
  sections += `</div>`;
  sections += `</section>`;

  // Convergence
  sections += `<section id="convergence"><h2>Monte Carlo convergence</h2>`;
  const conv = convergenceFigure(input.convergence);
  if (conv) {
    sections += `<p class="lead">Standard error of the estimate (and, dashed, its deviation from an independent high-ray reference) vs rays per point; plain Monte Carlo follows the 1/√N guide.</p>`;
    sections += use(conv);
  } else sections += note("Omitted: no convergence.json in the run (made by the convergence command).");
  sections += `</section>`;

  // Yield
  sections += `<section id="yield"><h2>Yearly optical yield</h2>`;
  const monthly = monthlyFigure(input.yields);
  const tilt = tiltFigure(input.tiltSweeps);
  if (!monthly && !tilt && input.yields.length === 0) sections += note("Omitted: no yield results in the run (yield/*.json).");
  else sections += `<p class="lead">Photon charge absorbed in the absorber per module area over the year (optical current × time) at the site, tilt and azimuth, and its share of what the same plane-of-array insolation would give at normal incidence under AM1.5G.</p>`;
  if (input.yields.length) sections += yieldTable(input);
  sections += `<div class="row">`;
  if (monthly) sections += use(monthly);
  const spectral = spectralCorrectionFigure(input.yields);
  if (spectral) sections += use(spectral);
  if (tilt) sections += use(tilt);
  sections += `</div>`;
  if (!tilt && input.yields.length) sections += note("Tilt sweep omitted: no yield result covers more than one tilt.");
  sections += `</section>`;

  // Bifacial
  const bifacial = input.bifacial ?? [];
  if (bifacial.length) {
    sections += `<section id="bifacial"><h2>Front and rear light</h2>`;
    sections += `<p class="lead">Yearly absorbed charge of the front and the rear of a bifacial stack, the total and the bifacial gain (rear / front), with Monte Carlo standard errors from both matrices. Rear light: 2D view factors of one isolated row or infinitely long rows over uniformly reflecting ground; racking shade and light reflected by neighbouring rows are left out.</p>`;
    sections += bifacialTable(bifacial);
    sections += `<div class="row">`;
    const bt = bifacialTiltFigure(bifacial);
    if (bt) sections += use(bt);
    const bp = bifacialPitchFigure(bifacial);
    if (bp) sections += use(bp);
    sections += `</div></section>`;
  }

  // Texture benefit
  sections += `<section id="benefit"><h2>Texture benefit</h2>`;
  if (input.benefit.length) {
    sections += `<p class="lead">Yearly absorbed charge of stack A relative to stack B, with the Monte Carlo standard error of the difference propagated from both matrices.</p>`;
    sections += benefitTable(input.benefit);
  } else sections += note("Omitted: no comparison in the run (yield/compare*.json).");
  sections += `</section>`;

  const page = `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">
<title>${html`lightfold report — ${input.title}`}</title>
<style>${REPORT_CSS}</style></head>
<body>
<header><h1>${html`lightfold report — ${input.title}`}</h1>
${input.runDirs.map((d) => html`<p>run directory: <code>${d}</code></p>`).join("")}
<p>${html`lightfold ${input.toolVersion}; optical estimates only (not an electrical or bankable energy yield).`}</p></header>
<main>${sections}
<footer>${html`Made by lightfold ${input.toolVersion}. Every plot is also saved as an SVG file next to this page.`}</footer>
</main></body></html>
`;
  return { html: page, figures };
}
