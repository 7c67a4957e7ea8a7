/** Inline stylesheet of the report page (our own look; no external fonts or resources). */
export const REPORT_CSS = `
:root { --ink: #1E2430; --soft: #5B6472; --line: #D5DAE1; --band: #14173D; --paper: #F6F7F9; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
  font: 15px/1.45 'DejaVu Sans', 'Liberation Sans', Arial, Helvetica, sans-serif; }
header { background: var(--band); color: #FCF5B8; padding: 22px 32px 18px; }
header h1 { margin: 0 0 6px; font-size: 24px; font-weight: 600; overflow-wrap: anywhere; }
header p { margin: 2px 0; color: #D8DCEA; font-size: 13px; overflow-wrap: anywhere; }
main { max-width: 1240px; margin: 0 auto; padding: 12px 24px 40px; }
section { background: #FFF; border: 1px solid var(--line); border-radius: 6px; margin: 18px 0; padding: 16px 20px; }
section h2 { margin: 0 0 4px; font-size: 19px; }
section h3 { margin: 14px 0 6px; font-size: 16px; overflow-wrap: anywhere; }
p.lead { margin: 0 0 10px; color: var(--soft); }
p.note { margin: 6px 0; padding: 6px 10px; border-left: 3px solid #E69F00; background: #FFF8E8; color: var(--ink); }
.row { display: flex; flex-wrap: wrap; gap: 18px; align-items: flex-start; }
figure { margin: 0; max-width: 100%; flex: 0 1 auto; }
figure svg { display: block; max-width: 100%; height: auto; }
figcaption { font-size: 12px; color: var(--soft); margin-top: 2px; }
table { border-collapse: collapse; font-size: 13px; margin: 6px 0; }
th, td { padding: 4px 10px; border-bottom: 1px solid var(--line); text-align: right; white-space: nowrap; }
th { background: #EEF1F5; font-weight: 600; }
td.text, th.text { text-align: left; white-space: normal; overflow-wrap: anywhere; max-width: 320px; }
tr.total td { font-weight: 600; border-top: 2px solid var(--ink); }
code { font-family: 'DejaVu Sans Mono', monospace; font-size: 12px; overflow-wrap: anywhere; }
footer { color: var(--soft); font-size: 12px; margin-top: 24px; }
`;
