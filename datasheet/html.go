package datasheet

import (
	"cylcav/figure"
	"html/template"
	"io"
)

// WriteHTML writes the datasheet to w as one self-contained HTML document:
// styles inline, charts as inline SVG, no scripts, no external resources.
// The output is deterministic (no dates).
func (sh *Sheet) WriteHTML(w io.Writer) error {
	type svgChart struct {
		Chart
		SVG template.HTML
	}
	// Pointers, so a chart that is absent (no wall metal, no Q chart)
	// is nil and skipped by the template's "with".
	var charts = map[string]*svgChart{}
	for _, c := range sh.Charts {
		b, err := figure.Encode(c.Figure, figure.SVG, c.Page)
		if err != nil {
			return err
		}
		// The SVG comes from our own renderer, which escapes all text.
		charts[c.ID] = &svgChart{Chart: c, SVG: template.HTML(figure.InlineSVG(b, c.Title))}
	}
	return page.Execute(w, struct {
		*Sheet
		Chart map[string]*svgChart
	}{sh, charts})
}

var page = template.Must(template.New("sheet").Parse(`<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="generator" content="cylcav {{.Version}}">
<title>{{.Title}}</title>
<style>
:root { --ink: #1a1a1a; --muted: #555; --rule: #c9c9c9; --band: #f3f1e6; --accent: #44677f; --warn: #8a2f12; }
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body { margin: 0; color: var(--ink); background: #fff;
  font: 15px/1.45 "Liberation Sans", Arial, Helvetica, sans-serif; }
main { max-width: 60rem; margin: 0 auto; padding: 1.5rem 1.5rem 3rem; }
header { border-bottom: 3px solid var(--ink); padding-bottom: .6rem; margin-bottom: 1rem; }
header .kind { text-transform: uppercase; letter-spacing: .12em; font-size: .78rem; color: var(--muted); margin: 0; }
h1 { font-size: 1.55rem; line-height: 1.25; margin: .2rem 0 .3rem; }
header .headline { margin: 0; font-size: 1.02rem; }
.demo { background: var(--band); border-left: 4px solid #ccbb44; padding: .45rem .7rem; margin: .8rem 0 0; font-size: .92rem; }
h2 { font-size: 1.12rem; margin: 1.8rem 0 .5rem; padding-bottom: .2rem; border-bottom: 1px solid var(--rule); break-after: avoid; }
h2 .num { color: var(--accent); margin-right: .4rem; }
.facts { display: grid; grid-template-columns: repeat(auto-fill, minmax(10.5rem, 1fr)); gap: .5rem; margin: 1rem 0 .4rem; padding: 0; list-style: none; }
.facts li { border: 1px solid var(--rule); border-top: 3px solid var(--accent); padding: .35rem .55rem; break-inside: avoid; }
.facts .k { display: block; font-size: .74rem; text-transform: uppercase; letter-spacing: .06em; color: var(--muted); }
.facts .v { display: block; font-size: 1.05rem; font-weight: bold; font-variant-numeric: tabular-nums; }
table { border-collapse: collapse; width: 100%; margin: .3rem 0 .6rem; font-size: .9rem; font-variant-numeric: tabular-nums; break-inside: avoid; }
caption { text-align: left; font-weight: bold; padding: .2rem 0 .35rem; }
th, td { text-align: left; padding: .28rem .55rem; border-bottom: 1px solid #e3e3e3; vertical-align: top; }
thead th { border-bottom: 2px solid var(--ink); font-size: .8rem; text-transform: uppercase; letter-spacing: .04em; color: #333; }
tbody tr:nth-child(even) { background: #fafafa; }
tr.emph td { font-weight: bold; background: var(--band); }
tr.emph td:first-child { box-shadow: inset 4px 0 0 var(--ink); }
td.num, th.num { text-align: right; white-space: nowrap; }
p.note { font-size: .85rem; color: var(--muted); margin: .1rem 0 .8rem; }
figure { margin: .8rem 0 1.2rem; break-inside: avoid; }
figure svg.chart { display: block; width: 100%; height: auto; border: 1px solid #e3e3e3; }
figcaption { font-size: .86rem; color: var(--muted); margin-top: .3rem; }
.materials { display: grid; grid-template-columns: repeat(auto-fit, minmax(17rem, 1fr)); gap: .8rem; }
.material { border: 1px solid var(--rule); padding: .5rem .7rem; break-inside: avoid; }
.material h3 { font-size: .95rem; margin: 0 0 .2rem; }
.material .role { font-size: .74rem; text-transform: uppercase; letter-spacing: .06em; color: var(--muted); }
.material dl { display: grid; grid-template-columns: auto 1fr; gap: .1rem .7rem; margin: .3rem 0; font-size: .88rem; }
.material dt { color: var(--muted); }
.material dd { margin: 0; font-variant-numeric: tabular-nums; }
.material .src { font-size: .8rem; color: var(--muted); margin: .3rem 0 0; }
ul.cautions { padding-left: 1.2rem; }
ul.cautions li { margin: .3rem 0; }
ul.safety { list-style: none; padding: 0; }
ul.safety li { border-left: 4px solid var(--warn); background: #fbf3ef; padding: .4rem .6rem; margin: .4rem 0; break-inside: avoid; }
footer { margin-top: 2rem; padding-top: .5rem; border-top: 1px solid var(--rule); font-size: .8rem; color: var(--muted); }
@page { size: A4; margin: 14mm 13mm 16mm; }
@media print {
  body { font-size: 9.5pt; }
  main { max-width: none; padding: 0; }
  h2 { margin-top: 1.1rem; }
  figure { page-break-inside: avoid; }
  figure svg.chart { max-height: 150mm; border: none; }
  table, .material, .facts li, ul.safety li { page-break-inside: avoid; }
  tbody tr:nth-child(even) { background: none; }
  a { color: inherit; text-decoration: none; }
}
</style>
</head>
<body>
<main>
<header>
<p class="kind">Cavity resonator datasheet</p>
<h1>{{.Title}}</h1>
<p class="headline">{{.Headline}}</p>
{{if .Demo}}<p class="demo"><strong>Demo scenario.</strong> This datasheet was made by <code>cylcav report</code> with no design flags, from the built-in invented scenario. Give the flags of <code>cylcav design</code> to report your own design.</p>{{end}}
</header>

<ul class="facts">
{{range .Facts}}<li><span class="k">{{.Key}}</span><span class="v">{{.Value}}</span></li>
{{end}}</ul>

<h2><span class="num">1</span>Dimensions and tolerances</h2>
{{template "table" .Dimensions}}

<h2><span class="num">2</span>Mode chart</h2>
{{with index .Chart "mode-chart"}}{{template "figure" .}}{{end}}

<h2><span class="num">3</span>Modes near the band</h2>
{{template "table" .Modes}}
<p class="note">{{.ModesNote}}</p>
{{with index .Chart "q-frequency"}}{{template "figure" .}}{{end}}

<h2><span class="num">4</span>Spurious-mode clearance</h2>
{{template "table" .Clearance}}
{{with index .Chart "trade-off"}}{{template "figure" .}}{{end}}

{{if .Q.Rows}}<h2><span class="num">5</span>Unloaded Q</h2>
{{template "table" .Q}}
<p class="note">{{.QNote}}</p>{{end}}

<h2><span class="num">6</span>Sensitivities and tolerance spread</h2>
{{template "table" .Sensitive}}
{{if .Spread.Rows}}{{template "table" .Spread}}{{end}}

<h2><span class="num">7</span>Tuning</h2>
{{with index .Chart "tuning"}}{{template "figure" .}}{{end}}
{{template "table" .Tuning}}

{{if .HasAccel}}<h2 id="accel"><span class="num">{{.Num "accel"}}</span>Operating figures</h2>
{{range .Accel}}{{template "table" .}}
{{end}}{{range .AccelNotes}}<p class="note">{{.}}</p>
{{end}}
{{end}}<h2><span class="num">{{.Num "materials"}}</span>Materials and their sources</h2>
<div class="materials">
{{range .Materials}}<section class="material">
<span class="role">{{.Role}}</span>
<h3>{{.Name}}</h3>
{{if .Description}}<div>{{.Description}}</div>{{end}}
<dl>{{range .Values}}<dt>{{.Key}}</dt><dd>{{.Value}}</dd>{{end}}</dl>
{{if .Note}}<p class="src"><strong>Note:</strong> {{.Note}}</p>{{end}}
<p class="src"><strong>Source:</strong> {{.Source}}</p>
</section>
{{end}}</div>

<h2><span class="num">{{.Num "convention"}}</span>Index convention</h2>
<p>{{.Convention}}</p>

<h2><span class="num">{{.Num "cautions"}}</span>Cautions</h2>
{{if .Cautions}}<p>For this design:</p>
<ul class="cautions">{{range .Cautions}}<li>{{.}}</li>{{end}}</ul>{{end}}
<p>Safety:</p>
<ul class="safety">{{range .Safety}}<li>{{.}}</li>{{end}}</ul>

<footer>Made by cylcav {{.Version}}. Resonant frequencies from the closed-cylinder resonance condition (Pozar, Microwave Engineering, 4th ed., sec. 6.4; Harrington, Time-Harmonic Electromagnetic Fields, sec. 5.3); unloaded Q by the surface-resistance perturbation method; clearance, optimum and tolerance analysis as described in the cylcav documentation.</footer>
</main>
</body>
</html>
{{define "table"}}<table>
<caption>{{.Caption}}</caption>
<thead><tr>{{range $j, $h := .Header}}<th scope="col"{{if $.IsNum $j}} class="num"{{end}}>{{$h}}</th>{{end}}</tr></thead>
<tbody>
{{range $i, $r := .Rows}}<tr{{if index $.Emph $i}} class="emph"{{end}}>{{range $j, $c := $r}}<td{{if $.IsNum $j}} class="num"{{end}}>{{$c}}</td>{{end}}</tr>
{{end}}</tbody>
</table>{{end}}
{{define "figure"}}<figure id="{{.ID}}">
{{.SVG}}
<figcaption><strong>{{.Title}}.</strong> {{.Caption}}</figcaption>
</figure>{{end}}
`))
