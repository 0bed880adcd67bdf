package reports

import (
	"html/template"
	"sync"
)

// pageTemplate is the report page, parsed once. html/template escapes
// every value for its context; the only unescaped insertions are the
// chart library (embedded at build time) and the chart options (encoded by
// chartJSON, in which <, > and & are escaped).
var pageTemplate = sync.OnceValue(func() *template.Template {
	return template.Must(template.New("report").Funcs(template.FuncMap{
		"add": func(a, b int) int { return a + b },
	}).Parse(pageHTML))
})

const pageHTML = `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:">
<meta name="generator" content="scalerisk">
<title>{{.Title}}</title>
<style>
:root {
  --ink: #1b2733; --muted: #5b6775; --rule: #dfe4ea; --sheet: #ffffff; --page: #eef1f5;
  --accent: #0072B2; --warn-bg: #fff5ec; --warn-rule: #D55E00;
}
* { box-sizing: border-box; }
html { background: var(--page); }
body { margin: 0; color: var(--ink); font: 15px/1.5 system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif; }
.sheet { max-width: 1100px; margin: 24px auto; background: var(--sheet); box-shadow: 0 1px 4px rgba(27,39,51,.12); }
header.cover { background: #1b2733; color: #fff; padding: 28px 40px 24px; }
header.cover .kicker { text-transform: uppercase; letter-spacing: .12em; font-size: 12px; color: #a9c7e0; }
header.cover h1 { margin: 6px 0 14px; font-size: 30px; font-weight: 650; line-height: 1.2; }
header.cover dl { display: grid; grid-template-columns: max-content 1fr; gap: 2px 18px; margin: 0; font-size: 14px; }
header.cover dt { color: #a9c7e0; }
header.cover dd { margin: 0; }
main { padding: 8px 40px 24px; }
section { margin-top: 28px; }
h2 { font-size: 22px; margin: 0 0 10px; padding-bottom: 6px; border-bottom: 2px solid var(--ink); font-weight: 650; }
h2 .num { color: var(--accent); margin-right: 10px; }
h3 { font-size: 16px; margin: 22px 0 8px; font-weight: 650; }
h4 { font-size: 15px; margin: 0 0 2px; font-weight: 650; }
p { margin: 6px 0; }
.where { color: var(--muted); font-size: 14px; margin-top: -4px; }
.muted { color: var(--muted); }
.small { font-size: 13px; }
nav.toc { font-size: 14px; padding: 10px 0 0; }
nav.toc ol { margin: 4px 0 0; padding-left: 22px; columns: 2; }
nav.toc a { color: var(--accent); text-decoration: none; }
table { border-collapse: collapse; width: 100%; font-size: 14px; margin: 6px 0 4px; }
th, td { text-align: left; padding: 5px 8px; border-bottom: 1px solid var(--rule); vertical-align: top; }
th { font-weight: 650; color: var(--muted); font-size: 13px; border-bottom: 1.5px solid #b9c2cc; }
td.nowrap { white-space: nowrap; }
td.n, th.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
tbody tr:nth-child(even) td { background: #f8f9fb; }
table.kv td:first-child { color: var(--muted); width: 46%; }
table.kv td.v { font-variant-numeric: tabular-nums; width: 30%; }
table.kv td.u { color: var(--muted); }
table.overview td:first-child { min-width: 11em; }
table.overview td:last-child .chip, table.minerals td:last-child .chip { white-space: normal; }
.cols { display: grid; grid-template-columns: 1fr 1fr; gap: 0 28px; }
.chip { display: inline-block; padding: 1px 9px; border-radius: 10px; font-size: 12.5px; font-weight: 600; white-space: nowrap; border: 1px solid rgba(0,0,0,.12); }
.b-under { background: #0072B2; color: #fff; } .b-near { background: #56B4E9; color: #000; }
.b-slow { background: #009E73; color: #000; } .b-within { background: #F0E442; color: #000; }
.b-super { background: #E69F00; color: #000; } .b-beyond { background: #D55E00; color: #000; }
.v-ok { background: #e3f3ec; color: #0b5a3f; } .v-check { background: #fde6d6; color: #8a2f00; } .v-none { background: #eef1f5; color: var(--muted); }
.facts { display: grid; grid-template-columns: repeat(4, 1fr); gap: 10px; margin: 12px 0 6px; }
.fact { border: 1px solid var(--rule); border-radius: 6px; padding: 8px 12px; background: #fbfcfd; }
.fact .label { font-size: 12.5px; font-weight: 600; color: var(--muted); }
.fact .value { font-size: 17px; font-weight: 650; margin: 2px 0; }
.fact .note { font-size: 12.5px; color: var(--muted); }
ul.findings { margin: 6px 0; padding-left: 20px; }
ul.findings li { margin: 3px 0; }
figure { margin: 16px 0; border: 1px solid var(--rule); border-radius: 6px; padding: 12px 14px 10px; break-inside: avoid; page-break-inside: avoid; }
figure figcaption { font-size: 13px; color: var(--muted); margin-top: 4px; }
.chart { width: 100%; }
.chart svg { max-width: 100%; }
.caution { background: var(--warn-bg); border-left: 4px solid var(--warn-rule); padding: 8px 12px; margin: 10px 0; font-size: 14px; }
.caution.small { font-size: 13px; }
ul.cautions li { margin: 5px 0; }
.legend-bands td:first-child { width: 1%; }
details { margin-top: 8px; font-size: 13px; }
details pre { white-space: pre-wrap; font-size: 11.5px; background: #f6f7f9; padding: 10px; border-radius: 4px; }
footer { padding: 14px 40px 24px; border-top: 1px solid var(--rule); color: var(--muted); font-size: 13px; }
a { color: var(--accent); }
@media (max-width: 820px) { .facts { grid-template-columns: 1fr 1fr; } .cols { grid-template-columns: 1fr; } main, header.cover, footer { padding-left: 18px; padding-right: 18px; } }
@page { size: A4; margin: 10mm 11mm; }
@media print {
  html, body { background: #fff; font-size: 10.5pt; }
  .sheet { margin: 0; max-width: none; box-shadow: none; }
  header.cover, .chip, .b-under, .b-near, .b-slow, .b-within, .b-super, .b-beyond, .v-ok, .v-check, .caution { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
  main, header.cover, footer { padding-left: 0; padding-right: 0; }
  header.cover { padding: 14px 16px; }
  nav.toc { display: none; }
  section.sample, section.break { break-before: page; page-break-before: always; }
  figure, table, .facts, .caution { break-inside: avoid; page-break-inside: avoid; }
  h2, h3, h4 { break-after: avoid; page-break-after: avoid; }
  a { color: inherit; text-decoration: none; }
  details > pre { display: none; }
  .facts { grid-template-columns: repeat(4, 1fr); }
  .chip { white-space: normal; }
  figure { max-width: 100%; overflow: hidden; margin: 8px 0; padding: 6px 8px; }
  figure h4 { font-size: 10pt; }
  figure figcaption { font-size: 8.5pt; margin-top: 2px; }
  /* The analysis, data quality and notes of a sample: small print, two columns. */
  .appendix { columns: 2; column-gap: 8mm; font-size: 8pt; line-height: 1.35; }
  .appendix table, .appendix p, .appendix ul { font-size: 8pt; }
  .appendix h3 { font-size: 10pt; margin-top: 6px; break-after: avoid; }
  .appendix .cols { display: block; }
  .appendix th, .appendix td { padding: 1px 4px; }
  .appendix table.kv td:first-child { width: auto; }
  .appendix table, #methods table { break-inside: auto; page-break-inside: auto; }
  tr { break-inside: avoid; page-break-inside: avoid; }
  /* A heading keeps the start of what follows it: no break after a heading, none before a
     table's first two rows, so a heading or a table's head never ends a page or column alone. */
  tbody > tr:first-child, tbody > tr:nth-child(2) { break-before: avoid; page-break-before: avoid; }
  #methods, #cautions { font-size: 8.5pt; }
  #methods table, #methods p, #methods ul, #cautions li { font-size: 8pt; }
  .appendix figure { break-inside: avoid; }
  table { font-size: 9pt; }
  th, td { padding: 2px 6px; }
  h2 { font-size: 15pt; } h3 { font-size: 11.5pt; margin: 10px 0 4px; }
  .facts { margin: 6px 0 2px; gap: 6px; }
  .fact { padding: 4px 8px; } .fact .value { font-size: 11pt; }
  /* The charts scale to the page: the script lays each out for the printed width at the
     height its max-height allows and gives each SVG a viewBox. */
  .chart { height: auto !important; max-height: 46mm; }
  .chart > div { width: 100% !important; height: auto !important; max-height: inherit; }
  .chart svg { position: static !important; width: 100% !important; height: auto !important; max-height: inherit; }
  /* The map of the operating window is one plot with its legend; the composition is two bars. */
  .chart[data-chart$="-window"] { max-height: 44mm; }
  .chart[data-chart$="-composition"] { max-height: 30mm; }
  /* Short key–value tables: two pairs a line. */
  table.pairs tbody { display: grid; grid-template-columns: minmax(0, 1fr) minmax(0, 1.7fr) max-content minmax(0, 1fr) minmax(0, 1.7fr) max-content; }
  .appendix table.pairs tbody { grid-template-columns: minmax(0, 1.3fr) max-content minmax(0, 1fr) minmax(0, 1.3fr) max-content minmax(0, 1fr); }
  table.pairs tr { display: contents; }
  table.kv.pairs td, table.pairs tbody tr:nth-child(even) td { background: none; width: auto; }
}
</style>
</head>
<body>
<div class="sheet">
<header class="cover">
  <div class="kicker">Mineral scale risk · water analysis report</div>
  <h1>{{.Title}}</h1>
  <dl>
    {{- if .Client}}<dt>Prepared for</dt><dd>{{.Client}}</dd>{{end}}
    {{- if .Date}}<dt>Date</dt><dd>{{.Date}}</dd>{{end}}
    {{- if .Inputs}}<dt>Data</dt><dd>{{range $i, $f := .Inputs}}{{if $i}}, {{end}}{{$f}}{{end}}</dd>{{end}}
    <dt>Samples</dt><dd>{{.SampleCount}} read, {{.ComputedCount}} computed{{if .Failed}}, {{len .Failed}} not computed{{end}}</dd>
  </dl>
</header>
<main>
<nav class="toc" aria-label="Contents"><strong>Contents</strong>
<ol>
  <li><a href="#summary">Summary</a></li>
  {{- range .Sections}}<li><a href="#{{.Anchor}}">{{.Name}}</a>{{if .Date}} <span class="muted">· {{.Date}}</span>{{end}}</li>{{end}}
  {{- if .Time}}<li><a href="#over-time">Indices over time</a></li>{{end}}
  {{- if .Balances}}<li><a href="#water-balance">Makeup and tower water balance</a></li>{{end}}
  <li><a href="#methods">Methods and data sources</a></li>
  <li><a href="#cautions">Cautions</a></li>
</ol>
</nav>

<section id="summary">
<h2><span class="num">1</span>Summary</h2>
<div class="caution"><strong>Advisory.</strong> {{.Caution}}</div>
{{- if .Overview}}
<table class="overview">
<thead><tr><th>Sample</th><th>Date</th><th class="n">Temperature, °C</th><th class="n">pH</th><th class="n">Ionic strength, mol/kg</th><th>Ion balance</th><th>Limiting mineral</th><th class="n">SI</th><th>Risk band</th></tr></thead>
<tbody>
{{- range .Overview}}
<tr><td>{{if .Anchor}}<a href="#{{.Anchor}}">{{.Name}}</a>{{else}}{{.Name}}{{end}}</td><td class="nowrap">{{.Date}}</td><td class="n">{{.Temperature}}</td><td class="n">{{.PH}}</td><td class="n">{{.IonicStrength}}</td><td><span class="chip {{.Balance.Class}}">{{.Balance.Text}}</span></td><td>{{.Limiting}}</td><td class="n">{{.LimitingSI}}</td><td>{{if .Band.Text}}<span class="chip {{.Band.Class}}">{{.Band.Text}}</span>{{end}}</td></tr>
{{- end}}
</tbody>
</table>
{{- end}}
<p class="muted small">{{.DetailNote}}</p>
{{- if .Failed}}
<h3>Samples not computed</h3>
<table><thead><tr><th>Sample</th><th>Where</th><th>Why</th></tr></thead><tbody>
{{- range .Failed}}<tr><td>{{if .Anchor}}<a href="#{{.Anchor}}">{{.Name}}</a>{{else}}{{.Name}}{{end}}</td><td>{{.Where}}</td><td>{{.Error}}</td></tr>{{end}}
</tbody></table>
{{- end}}
<h3>Risk bands</h3>
<table class="legend-bands"><tbody>
{{- range .Bands}}<tr><td><span class="chip {{.Chip.Class}}">{{.Chip.Text}}</span></td><td>{{.Meaning}}</td></tr>{{end}}
</tbody></table>
<p class="muted small">{{.LimitingNote}} SI = log<sub>10</sub>(IAP/K<sub>sp</sub>), the saturation index.</p>
</section>

{{- range .Sections}}
<section class="sample" id="{{.Anchor}}">
<h2><span class="num">{{add .Number 1}}</span>{{.Name}}</h2>
{{- if .Where}}<p class="where">{{.Where}}</p>{{end}}
<div class="facts">
{{- range .Facts}}<div class="fact"><div class="label">{{.Label}}</div><div class="value">{{.Value}}</div>{{if .Chip}}<span class="chip {{.Chip.Class}}">{{.Chip.Text}}</span>{{end}}{{if .Note}}<div class="note">{{.Note}}</div>{{end}}</div>{{end}}
</div>
{{- if .SpeciationError}}
<div class="caution"><strong>Not computed.</strong> The equilibrium of this sample could not be computed: {{.SpeciationError}}. {{.SpeciationErrorDetail}}</div>
{{- end}}
<h3>Findings</h3>
<ul class="findings">{{range .Findings}}<li>{{.}}</li>{{end}}</ul>
{{- if not .SpeciationError}}

<h3>What to act on</h3>
<table class="minerals">
<thead><tr><th>Mineral</th><th>Formula</th><th class="n">SI</th>{{if .Intervals}}<th class="n">{{.IntervalHead}}</th><th class="n">P(SI &gt; 0)</th>{{end}}<th class="n">Limit (SI)</th><th class="n">Margin to the limit</th><th>Risk band</th></tr></thead>
<tbody>
{{- range .Minerals}}<tr><td>{{.Name}}</td><td>{{.Formula}}</td><td class="n">{{.SI}}</td>{{if .Interval}}<td class="n">{{.Interval}}</td><td class="n">{{.PAbove}}</td>{{end}}<td class="n">{{.Limit}}</td><td class="n">{{.Margin}}</td><td><span class="chip {{.Band.Class}}">{{.Band.Text}}</span></td></tr>{{end}}
</tbody>
</table>
<p class="muted small">{{$.LimitsNote}} The margin is the limit minus the saturation index: the room left before the limit (negative: past it).{{if .MineralsOmitted}} {{.OmittedNote}}{{end}}</p>
{{- end}}

{{- with .Treatment}}
<h3>Treatment</h3>
{{- if .NoDose}}
<h4>Dose to target</h4>
<p>{{.NoDose}}</p>
{{- end}}
{{- if .Dose}}
<h4>Dose to target</h4>
<table class="kv pairs"><tbody>{{range .Dose}}<tr><td>{{.Key}}</td><td class="v">{{.Value}}</td><td class="u">{{.Unit}}</td></tr>{{end}}</tbody></table>
{{- if .Effects}}
<p class="small">Saturation indices that rise with the dose (side effects):</p>
<table><thead><tr><th>Mineral</th><th class="n">Before</th><th class="n">After</th><th>Risk band after</th></tr></thead><tbody>
{{- range .Effects}}<tr><td>{{.Mineral}}</td><td class="n">{{.Before}}</td><td class="n">{{.After}}</td><td><span class="chip {{.Band.Class}}">{{.Band.Text}}</span></td></tr>{{end}}
</tbody></table>
{{- end}}
{{- if .DoseWarnings}}<ul class="small">{{range .DoseWarnings}}<li>{{.}}</li>{{end}}</ul>{{end}}
{{- if .Caution}}<div class="caution small"><strong>Caution.</strong> {{.Caution}}</div>{{end}}
{{- end}}
{{- if .Cycles}}
<h4>Highest cycles of concentration</h4>
<table class="kv pairs"><tbody>{{range .Cycles}}<tr><td>{{.Key}}</td><td class="v">{{.Value}}</td><td class="u">{{.Unit}}</td></tr>{{end}}</tbody></table>
{{- if .CycleNotes}}<ul class="small">{{range .CycleNotes}}<li>{{.}}</li>{{end}}</ul>{{end}}
{{- end}}
{{- range .Blends}}
<h4>Blend: {{.Title}}</h4>
{{- if .Verdict}}<p>{{.Verdict}}</p>{{end}}
{{- if .Share}}<p>{{.Share}}</p>{{end}}
<table><thead><tr><th>Mineral</th><th>Formula</th><th class="n">SI</th><th>Risk band</th></tr></thead><tbody>
{{- range .Minerals}}<tr><td>{{.Name}}</td><td>{{.Formula}}</td><td class="n">{{.SI}}</td><td><span class="chip {{.Band.Class}}">{{.Band.Text}}</span></td></tr>{{end}}
</tbody></table>
{{- end}}
{{- range .Notes}}<p class="muted small">{{.}}</p>{{end}}
{{- end}}
{{- with .Uncertainty}}
<h3>How sure are these answers</h3>
<p>{{.Run}}</p>
{{- if .Answers}}<ul>{{range .Answers}}<li>{{.}}</li>{{end}}</ul>{{end}}
{{- if .Narrowing}}<p>{{.Narrowing}}</p>{{end}}
{{- if .Inputs}}<p class="muted small">{{.Inputs}}</p>{{end}}
{{- if .Meaning}}<p class="muted small">{{.Meaning}}</p>{{end}}
{{- if .Notes}}<ul class="small">{{range .Notes}}<li>{{.}}</li>{{end}}</ul>{{end}}
{{- end}}
{{- range .ChartNotes}}<p class="muted small">{{.}}</p>{{end}}
{{- range .Charts}}
<figure>
<h4>{{.Title}}</h4>
<div class="chart" id="{{.ID}}" data-chart="{{.ID}}" style="height: {{.Height}}px"></div>
<figcaption>{{.Caption}}</figcaption>
{{- if .Caution}}<div class="caution small"><strong>Caution.</strong> {{.Caution}}</div>{{end}}
</figure>
{{- end}}

<div class="appendix">
{{- if .Indices}}
<h3>Classic indices at {{.IndicesAt}}</h3>
<table><thead><tr><th>Index</th><th class="n">Value</th><th>Reading</th></tr></thead><tbody>
{{- range .Indices}}<tr><td>{{.Name}}</td><td class="n">{{.Value}}</td><td class="muted">{{.Reading}}</td></tr>{{end}}
</tbody></table>
{{- end}}
{{- if .Scale}}
<h3>Scale that could form</h3>
<table><thead><tr><th>Mineral</th><th class="n">SI</th><th class="n">alone, mg/L</th><th class="n">together, mg/L</th>{{if .ScaleKg}}<th class="n">alone, kg/day</th><th class="n">together, kg/day</th>{{end}}</tr></thead><tbody>
{{- range .Scale}}<tr><td>{{.Mineral}}</td><td class="n">{{.SI}}</td><td class="n">{{.Alone}}</td><td class="n">{{.Together}}</td>{{if .AloneKg}}<td class="n">{{.AloneKg}}</td><td class="n">{{.TogetherKg}}</td>{{end}}</tr>{{end}}
</tbody></table>
<p class="muted small">Milligrams of mineral per litre of water that would deposit for the water to reach equilibrium with it: each mineral alone, and all of them together (they compete for the same ions). Closed system, at {{.IndicesAt}}.{{if not .ScaleKg}} Amounts per day need the flow of the water, which was not given.{{end}}</p>
{{- end}}
<h3>The analysis as entered and as used</h3>
<div class="cols">
<table class="kv pairs"><tbody>{{range .Entered}}<tr><td>{{.Key}}</td><td class="v">{{.Value}}</td><td class="u">{{.Unit}}</td></tr>{{end}}</tbody></table>
<div>
<p class="muted small">Concentrations are read in the units of the file and converted to mol/kg of water with the density and the mass of water per litre shown; mg/L are given back as the ion (SO₄, NO₃, SiO₂, PO₄). Inorganic carbon is not measured: pH and alkalinity fix it.</p>
{{- if .BelowDetection}}
<p class="small"><strong>Below detection.</strong> {{.DetectionNote}}</p>
<ul class="small">{{range .BelowDetection}}<li>{{.}}</li>{{end}}</ul>
{{- end}}
</div>
</div>
<table class="components">
<thead><tr><th>Constituent</th><th class="n">mg/L</th><th class="n">mmol/kg water</th><th class="n">meq/L</th></tr></thead>
<tbody>{{range .Components}}<tr><td>{{.Name}}</td><td class="n">{{.MgPerL}}</td><td class="n">{{.MmolPerKg}}</td><td class="n">{{.MeqPerL}}</td></tr>{{end}}</tbody>
</table>

<h3>Data quality</h3>
<table class="quality">
<thead><tr><th>Check</th><th>Applies</th><th class="n">Value</th><th class="n">Criterion</th><th>Verdict</th></tr></thead>
<tbody>{{range .Quality}}<tr><td>{{.Check}}</td><td class="muted">{{.Applies}}</td><td class="n">{{.Value}}</td><td class="n">{{.Limit}}</td><td><span class="chip {{.Verdict.Class}}">{{.Verdict.Text}}</span></td></tr>{{end}}</tbody>
</table>
{{- if .LabChecks}}
<ul class="small checks">{{range .LabChecks}}<li>{{.Text}} <span class="chip {{.Verdict.Class}}">{{.Verdict.Text}}</span></li>{{end}}</ul>
{{- end}}
{{- if .LabReported}}
<p class="small"><strong>Also reported by the lab, not used in the calculation:</strong> {{.LabReported}}.</p>
{{- end}}
<table class="kv"><tbody>{{range .QualitySums}}<tr><td>{{.Key}}</td><td class="v">{{.Value}}</td><td class="u">{{.Unit}}</td></tr>{{end}}</tbody></table>
{{- if .Equilibrium}}
<h4>The equilibrium solved</h4>
<table class="kv pairs"><tbody>{{range .Equilibrium}}<tr><td>{{.Key}}</td><td class="v">{{.Value}}</td><td class="u">{{.Unit}}</td></tr>{{end}}</tbody></table>
{{- end}}
{{- if .QualityFlags}}<ul class="small">{{range .QualityFlags}}<li>{{.}}</li>{{end}}</ul>{{end}}

{{- if .Warnings}}
<h3>Notes and warnings</h3>
<ul class="small">{{range .Warnings}}<li>{{.}}</li>{{end}}</ul>
{{- end}}
</div>
</section>
{{- end}}

{{- if .Time}}
<section id="over-time" class="break">
<h2><span class="num">{{.TimeNum}}</span>Indices over time</h2>
<p class="muted small">Waters sampled on two or more dates, each sample at its own temperature. {{.TimeKey}}</p>
{{- range .Time}}
<figure>
<h4>{{.Title}}</h4>
<div class="chart" id="{{.ID}}" data-chart="{{.ID}}" style="height: {{.Height}}px"></div>
<figcaption>{{.Caption}}</figcaption>
</figure>
{{- end}}
{{- if .TimeNote}}<p class="muted small">{{.TimeNote}}</p>{{end}}
</section>
{{- end}}

{{- if .Balances}}
<section id="water-balance">
<h2><span class="num">{{.BalanceNum}}</span>Makeup and tower water balance</h2>
<p class="muted small">Each tower (recirculating or blowdown) sample is set against the makeup of its system. Cycles of concentration are the tower concentration over the makeup concentration of each ion that stays in solution in a healthy tower (chloride, magnesium, sodium, silica, conductivity); the tower's cycles are their median. An ion whose cycles fall more than 10 % below is missing from the tower: its deficit is makeup × cycles − tower, and where it comes out of solution it deposits (common practice). Chloride can read high from chlorination and conductivity from acid feed, which is why the median is taken.</p>
{{- range .Balances}}
<h3>{{.Title}}</h3>
{{- if .Where}}<p class="where">{{.Where}}</p>{{end}}
{{- if .Error}}<p>The balance could not be made: {{.Error}}</p>{{else}}
<p>Cycles of concentration: <strong>{{.Cycles}}</strong> (median of {{.Basis}}; spread {{.Spread}}).</p>
<table>
<thead><tr><th>Ion</th><th>Unit</th><th class="n">Makeup</th><th class="n">Tower</th><th class="n">Cycles</th><th class="n">Deficit</th>{{if .Kg}}<th class="n">Deficit, kg/day</th>{{end}}<th>Reading</th></tr></thead>
<tbody>
{{- range .Rows}}<tr><td>{{.Ion}}</td><td>{{.Unit}}</td><td class="n">{{.Makeup}}</td><td class="n">{{.Tower}}</td><td class="n">{{.Cycles}}</td><td class="n">{{.Deficit}}</td>{{if .Kg}}<td class="n">{{.Kg}}</td>{{end}}<td>{{.Reading}}</td></tr>{{end}}
</tbody></table>
<p class="muted small">{{if .Kg}}Deficits per day are at the flow given, taken as the tower's blowdown.{{else}}Deficits per day need the blowdown flow, which was not given.{{end}}</p>
<p>{{.Missing}}</p>
<p><strong>{{.Deposit}}</strong></p>
{{- if .Notes}}<ul class="small">{{range .Notes}}<li>{{.}}</li>{{end}}</ul>{{end}}
{{- end}}
{{- end}}
</section>
{{- end}}

<section id="methods" class="break">
<h2><span class="num">{{.MethodsNum}}</span>Methods and data sources</h2>
{{- with .Methods}}
<table class="kv"><tbody>
<tr><td>Speciation</td><td>Mass balances of every component and the proton balance solved together by Newton–Raphson with the ion pairs and complexes of the table; saturation index SI = log<sub>10</sub>(IAP/K<sub>sp</sub>).</td></tr>
<tr><td>Activity coefficients</td><td>{{.Activity}}</td></tr>
<tr><td>Thermodynamic data</td><td>{{.Thermo}}{{if .UserTable}} {{.UserTable}}{{end}}</td></tr>
<tr><td>Carbonate system</td><td>{{.Carbonate}}</td></tr>
<tr><td>Detection limits</td><td>{{.Detection}}</td></tr>
<tr><td>Charts</td><td><ul class="small">{{range .Charts}}<li>{{.}}</li>{{end}}</ul></td></tr>
</tbody></table>
<h3>Data-quality criteria</h3>
<table><thead><tr><th>Check</th><th class="n">Acceptable</th></tr></thead><tbody>
{{- range .Criteria}}<tr><td>{{.Key}}</td><td class="n">{{.Value}}</td></tr>{{end}}
</tbody></table>
<p class="muted small">Source: {{.CriteriaSource}}. Ionic-strength estimates: Langelier (1936), I ≈ 2.5×10⁻⁵ × TDS; Russell (1976), I ≈ 1.6×10⁻⁵ × EC.</p>
{{- if .Sources}}
<h3>Minerals and their equilibrium constants</h3>
<p class="muted small">Every mineral of the samples, with its solubility constant at 25 °C (log K) and the temperature range of its constant.</p>
<table class="small"><thead><tr><th>Mineral</th><th>Formula</th><th class="n">log K 25 °C</th><th class="n">Range</th><th>Source</th></tr></thead><tbody>
{{- range .Sources}}<tr><td>{{.Name}}</td><td>{{.Formula}}</td><td class="n">{{.LogK}}</td><td class="n">{{.Range}}</td><td>{{.Source}}</td></tr>{{end}}
</tbody></table>
{{- end}}
{{- if .Reach}}
<h3>Limits behind the risk bands</h3>
<table class="small"><thead><tr><th>Mineral</th><th class="n">Limit (SI)</th><th>Basis</th></tr></thead><tbody>
{{- range .Reach}}<tr><td>{{.Name}}</td><td class="n">{{.Limit}}</td><td>{{.Source}}</td></tr>{{end}}
</tbody></table>
<p class="muted small">{{.ReachNote}}</p>
{{- end}}
{{- end}}
</section>

<section id="cautions">
<h2><span class="num">{{.CautionsNum}}</span>Cautions</h2>
<div class="caution">{{.Caution}}</div>
<ul class="cautions">{{range .Cautions}}<li>{{.}}</li>{{end}}</ul>
</section>
</main>
<footer>
<p>Computed and written by scalerisk. {{.ChartCountText}}. Charts drawn with Apache ECharts {{.EChartsVersion}}, inlined in this file under the Apache License 2.0; the file needs no network connection.</p>
<details><summary>Third-party software: notice and licence</summary>
<pre>{{.EChartsNotice}}</pre>
<pre>{{.EChartsLicense}}</pre>
</details>
</footer>
</div>
<script>{{.EChartsJS}}</script>
<script>
(function () {
  "use strict";
  var options = {{.ChartOptions}};
  var drawn = [];
  // A viewBox lets the print style scale each chart to the page width.
  function fit(node) {
    var svg = node.querySelector("svg");
    if (svg) {
      svg.setAttribute("viewBox", "0 0 " + svg.getAttribute("width") + " " + svg.getAttribute("height"));
      svg.setAttribute("preserveAspectRatio", "xMinYMin meet");
    }
  }
  var printing = window.matchMedia ? window.matchMedia("print") : null;
  // printSize is the size a chart is laid out at in print: its own height,
  // and the width that, scaled by the viewBox to the printed height (the
  // chart's max-height in the print style), fills the printed width. The
  // chart thus has the room in print it has on screen, and no label clashes
  // with another or is cut off at an edge.
  function printSize(d) {
    var width = d.node.getBoundingClientRect().width;
    var cap = parseFloat(getComputedStyle(d.node).maxHeight);
    var scale = cap > 0 && cap < d.height ? cap / d.height : 1;
    return { width: Math.round(width / scale), height: d.height };
  }
  // layout lays a chart out for the media the page is shown in now: its
  // container on screen, the printed page in print. It draws at once, so
  // the drawing is ready when the page is printed.
  function layout(d) {
    if (printing && printing.matches) {
      d.chart.resize(printSize(d));
    } else {
      d.chart.resize({ width: "auto", height: d.height });
    }
    d.chart.getZr().flush();
    fit(d.node);
  }
  var nodes = document.querySelectorAll("div.chart[data-chart]");
  for (var i = 0; i < nodes.length; i++) {
    var option = options[nodes[i].getAttribute("data-chart")];
    if (!option) { continue; }
    var d = { node: nodes[i], height: parseFloat(nodes[i].style.height) };
    d.chart = echarts.init(nodes[i], null, { renderer: "svg", height: d.height });
    d.chart.setOption(option);
    if (printing && printing.matches) { layout(d); }
    fit(nodes[i]);
    drawn.push(d);
  }
  function layoutAll() {
    for (var j = 0; j < drawn.length; j++) { layout(drawn[j]); }
  }
  // Printing switches the media to print at the printed width, and back.
  // A resize lays out for the media too: reading printing.matches there
  // can take the place of the change event.
  window.addEventListener("resize", layoutAll);
  if (printing && printing.addEventListener) {
    printing.addEventListener("change", layoutAll);
  } else if (printing && printing.addListener) {
    printing.addListener(layoutAll);
  }
  window.addEventListener("afterprint", layoutAll);
})();
</script>
</body>
</html>
`
