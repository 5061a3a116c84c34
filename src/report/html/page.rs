//! The document shell of `report.html`: CSS for screen and print (A4 and US Letter, page
//! breaks, a running header with site and date), and the wrapping of parts into sections.

use crate::report::format::esc;

/// One part of the report: a `<section id=…>` with a heading and HTML body.
#[derive(Debug, Clone)]
pub struct Part {
    /// The section's id (stable: tests and the browser check look for it).
    pub id: &'static str,
    /// Heading.
    pub title: String,
    /// Inner HTML.
    pub body: String,
    /// Start this part on a new printed page.
    pub page_break: bool,
}

impl Part {
    /// A part that flows on from the previous one.
    pub fn new(id: &'static str, title: impl Into<String>, body: String) -> Part {
        Part {
            id,
            title: title.into(),
            body,
            page_break: false,
        }
    }
    /// The same part, starting a new printed page.
    pub fn on_new_page(mut self) -> Part {
        self.page_break = true;
        self
    }
}

/// Every section id a full report holds, in order.
pub const SECTION_IDS: [&str; 12] = [
    "summary",
    "inputs",
    "methods",
    "estimate",
    "map",
    "section",
    "wells",
    "checkpoints",
    "neighbours",
    "uplift",
    "bid",
    "cautions",
];

const CSS: &str = r#"
:root { --ink:#1b1b1b; --rule:#c8c8c8; --head:#eef1f4; --bad:#b00020; --good:#1b6e20; }
* { box-sizing: border-box; }
html { font-family: "Helvetica Neue", Helvetica, Arial, sans-serif; font-size: 10.5pt; color: var(--ink); }
body { margin: 0 auto; max-width: 180mm; padding: 8mm 0; }
header.page { display: flex; justify-content: space-between; border-bottom: 1.5pt solid var(--ink); padding-bottom: 2mm; margin-bottom: 4mm; font-size: 9pt; }
header.page .site { font-weight: bold; }
h1 { font-size: 17pt; margin: 2mm 0 3mm; }
h2 { font-size: 13pt; margin: 7mm 0 2mm; border-bottom: 0.5pt solid var(--rule); padding-bottom: 1mm; }
h3 { font-size: 11pt; margin: 4mm 0 1mm; }
p { margin: 1.5mm 0; line-height: 1.35; }
table { border-collapse: collapse; width: 100%; max-width: 100%; table-layout: fixed; margin: 2mm 0 3mm; font-size: 9pt; }
th, td { border: 0.5pt solid var(--rule); padding: 1mm 1.5mm; text-align: left; vertical-align: top; overflow-wrap: anywhere; }
th { background: var(--head); font-weight: bold; font-size: 8pt; overflow-wrap: normal; hyphens: auto; }
td.n, th.n { text-align: right; font-variant-numeric: tabular-nums; }
tr { break-inside: avoid; }
thead { display: table-header-group; }
.result { font-size: 12pt; padding: 2mm 3mm; border-left: 3pt solid var(--good); background: #f3f8f3; }
.result.bad { border-left-color: var(--bad); background: #fbf1f2; }
.bad { color: var(--bad); font-weight: bold; }
.note { font-size: 9pt; color: #444; }
figure { margin: 2mm 0; break-inside: avoid; }
figure svg { display: block; width: 100%; height: auto; max-height: 235mm; }
figcaption { font-size: 9pt; color: #444; margin-top: 1mm; }
.caution { border: 1pt solid var(--bad); padding: 2mm 3mm; }
section { break-inside: auto; }
section.new-page { break-before: page; }
h2, h3 { break-after: avoid; }
/* No fixed paper size: the printer's A4 or US Letter is used. The text block (180 mm wide,
   figures at most 235 mm high) fits inside either with 15 mm margins. */
@page { margin: 15mm 15mm 16mm 15mm; }
@media print {
  body { max-width: none; padding: 0; }
  a { color: inherit; text-decoration: none; }
}
"#;

/// The whole document: `title` (h1), a running header with `site` and `date`, the parts.
pub fn document(site: &str, date: &str, title: &str, parts: &[Part]) -> String {
    let mut out = String::new();
    out.push_str("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
    out.push_str(&format!(
        "<title>{} — {}</title>\n<style>{CSS}</style>\n</head>\n<body>\n",
        esc(title),
        esc(site)
    ));
    out.push_str(&format!(
        "<header class=\"page\"><span class=\"site\">{}</span><span>drydig report · {}</span></header>\n<h1>{}</h1>\n",
        esc(site),
        esc(date),
        esc(title)
    ));
    for p in parts {
        out.push_str(&format!(
            "<section id=\"{}\"{}>\n<h2>{}</h2>\n{}\n</section>\n",
            p.id,
            if p.page_break {
                " class=\"new-page\""
            } else {
                ""
            },
            esc(&p.title),
            p.body
        ));
    }
    out.push_str("</body>\n</html>\n");
    out
}

/// An HTML table: header cells and rows of cells (already escaped HTML); cells whose header
/// starts with `#` are right-aligned numbers (the `#` is not shown).
pub fn table(head: &[&str], rows: &[Vec<String>]) -> String {
    let num: Vec<bool> = head.iter().map(|h| h.starts_with('#')).collect();
    let mut out = String::from("<table>\n<thead><tr>");
    for (h, n) in head.iter().zip(&num) {
        out.push_str(&format!(
            "<th{}>{}</th>",
            if *n { " class=\"n\"" } else { "" },
            esc(h.trim_start_matches('#'))
        ));
    }
    out.push_str("</tr></thead>\n<tbody>\n");
    for r in rows {
        out.push_str("<tr>");
        for (i, c) in r.iter().enumerate() {
            let n = num.get(i).copied().unwrap_or(false);
            out.push_str(&format!(
                "<td{}>{c}</td>",
                if n { " class=\"n\"" } else { "" }
            ));
        }
        out.push_str("</tr>\n");
    }
    out.push_str("</tbody>\n</table>\n");
    out
}

/// A two-column table of (label, value) pairs, both plain text.
pub fn facts(rows: &[(&str, String)]) -> String {
    let rows: Vec<Vec<String>> = rows.iter().map(|(k, v)| vec![esc(k), esc(v)]).collect();
    table(&["item", "value"], &rows)
}

/// An SVG drawing made safe to sit inline beside others: the XML declaration dropped and every
/// `id` (and its `url(#…)` / `href="#…"` uses) prefixed with `prefix-`.
pub fn inline_svg(svg: &str, prefix: &str) -> String {
    let body = match svg.find("<svg") {
        Some(i) => &svg[i..],
        None => svg,
    };
    body.replace(" id=\"", &format!(" id=\"{prefix}-"))
        .replace("url(#", &format!("url(#{prefix}-"))
        .replace("href=\"#", &format!("href=\"#{prefix}-"))
}
