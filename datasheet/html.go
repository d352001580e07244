package datasheet

import (
	"html/template"
	"io"

	"cylcav/figure"
)

// WriteHTML writes the datasheet to w as one self-contained HTML document:
// styles inline, charts as inline SVG, no scripts, no external resources.
// The output is deterministic (no dates).
func (sh *Sheet) WriteHTML(w io.Writer) error {
	type htmlBlock struct {
		Block
		SVG template.HTML // the chart, when the block is one
	}
	type htmlSection struct {
		Num     int
		Heading string
		Blocks  []htmlBlock
	}
	secs := make([]htmlSection, len(sh.Sections))
	for i, s := range sh.Sections {
		secs[i] = htmlSection{Num: i + 1, Heading: s.Heading}
		for _, b := range s.Blocks {
			hb := htmlBlock{Block: b}
			if c := b.Chart; c != nil {
				svg, err := figure.Encode(c.Figure, figure.SVG, c.Page)
				if err != nil {
					return err
				}
				// The SVG comes from our own renderer, which escapes all text.
				hb.SVG = template.HTML(figure.InlineSVG(svg, c.Title))
			}
			secs[i].Blocks = append(secs[i].Blocks, hb)
		}
	}
	return page.Execute(w, struct {
		*Sheet
		Sections []htmlSection
	}{sh, secs})
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
<p class="kind">{{.Kind}}</p>
<h1>{{.Title}}</h1>
<p class="headline">{{.Headline}}</p>
{{with .Notice}}<p class="demo"><strong>{{.Lead}}.</strong> {{range .Parts}}{{if .Code}}<code>{{.Text}}</code>{{else}}{{.Text}}{{end}}{{end}}</p>{{end}}
</header>

<ul class="facts">
{{range .Facts}}<li><span class="k">{{.Key}}</span><span class="v">{{.Value}}</span></li>
{{end}}</ul>

{{range .Sections}}<h2><span class="num">{{.Num}}</span>{{.Heading}}</h2>
{{range .Blocks}}{{template "block" .}}
{{end}}
{{end}}<footer>Made by cylcav {{.Version}}. {{.Method}}</footer>
</main>
</body>
</html>
{{define "table"}}<table>
<caption>{{.Caption}}</caption>
<thead><tr>{{range $j, $h := .Header}}<th scope="col"{{if $.IsNum $j}} class="num"{{end}}>{{$h}}</th>{{end}}</tr></thead>
<tbody>
{{range $i, $r := .Rows}}<tr{{if $.IsEmph $i}} class="emph"{{end}}>{{range $j, $c := $r}}<td{{if $.IsNum $j}} class="num"{{end}}>{{$c}}</td>{{end}}</tr>
{{end}}</tbody>
</table>{{end}}
{{define "block"}}{{with .Table}}{{template "table" .}}{{end}}{{with .Chart}}<figure id="{{.ID}}">
{{$.SVG}}
<figcaption><strong>{{.Title}}.</strong> {{.Caption}}</figcaption>
</figure>{{end}}{{with .Note}}<p class="note">{{.}}</p>{{end}}{{with .Para}}<p>{{.}}</p>{{end}}{{with .List}}{{if .Lead}}<p>{{.Lead}}</p>
{{end}}<ul class="{{.Class}}">{{range .Items}}<li>{{.}}</li>{{end}}</ul>{{end}}{{with .Materials}}<div class="materials">
{{range .}}<section class="material">
<span class="role">{{.Role}}</span>
<h3>{{.Name}}</h3>
{{if .Description}}<div>{{.Description}}</div>{{end}}
<dl>{{range .Values}}<dt>{{.Key}}</dt><dd>{{.Value}}</dd>{{end}}</dl>
{{if .Note}}<p class="src"><strong>Note:</strong> {{.Note}}</p>{{end}}
<p class="src"><strong>Source:</strong> {{.Source}}</p>
</section>
{{end}}</div>{{end}}{{end}}
`))
