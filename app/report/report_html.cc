#include "app/report/report_html.h"

#include <cmath>
#include <cstdio>

namespace locind::app {
namespace {

std::string Escape(const std::string& text) {
  std::string out;
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      default: out += c;
    }
  }
  return out;
}

constexpr char kStyle[] =
    "body{font-family:Helvetica,Arial,sans-serif;max-width:1100px;margin:2em auto;padding:0 1em;"
    "color:#222;line-height:1.45}"
    "h1{font-size:1.6em}h2{font-size:1.25em;border-bottom:1px solid #ccc;padding-bottom:.2em;margin-top:2em}"
    "table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #ccc;padding:.2em .5em;"
    "text-align:left;vertical-align:top}th{background:#f2f2f2}td.n{text-align:right;"
    "font-variant-numeric:tabular-nums}"
    "figure{margin:1em 1.5em 1em 0;display:inline-table;vertical-align:top}"
    "figure svg{max-width:calc(100vw - 4em);height:auto}figcaption{display:table-caption;caption-side:bottom;"
    "font-size:.9em;color:#444}"
    ".caution{border-left:4px solid #D55E00;background:#fbf3ee;padding:.6em 1em}"
    ".warnings{border-left:4px solid #CC0000;background:#fdecec;padding:.6em 1em}"
    ".warnings p{margin:.2em 0}tr.flagged td{background:#fdecec}";

void WriteStudyTable(const ReportPage& page, std::ostream& out) {
  out << "<section id=\"study\"><h2>The study</h2>\n<table>\n";
  for (const auto& [key, value] : page.study) {
    out << "<tr><th>" << Escape(key) << "</th><td>" << Escape(value) << "</td></tr>\n";
  }
  out << "</table></section>\n";
}

void WriteFigure(const ReportFigure& f, std::ostream& out) {
  out << "<figure id=\"" << Escape(f.id) << "\">\n" << InlineSvg(f.svg, f.id) << "\n<figcaption><b>"
      << Escape(f.title) << ".</b> " << Escape(f.caption) << " (figures/" << Escape(f.id)
      << ".svg)</figcaption></figure>\n";
}

void WriteTable(const ReportTable& t, std::ostream& out) {
  out << "<table id=\"" << Escape(t.id) << "\">\n";
  if (!t.caption.empty()) out << "<caption>" << Escape(t.caption) << "</caption>\n";
  out << "<tr>";
  for (const std::string& h : t.header) out << "<th>" << Escape(h) << "</th>";
  out << "</tr>\n";
  for (const ReportTable::Row& r : t.rows) {
    out << "<tr data-key=\"" << Escape(r.key) << "\"" << (r.flagged ? " class=\"flagged\"" : "") << ">";
    for (size_t i = 0; i < r.cells.size(); ++i) {
      const std::string column = i < t.columns.size() ? t.columns[i] : "";
      out << "<td data-col=\"" << Escape(column) << "\">" << Escape(r.cells[i]) << "</td>";
    }
    out << "</tr>\n";
  }
  out << "</table>\n";
}

void WriteSection(const ReportSection& s, std::ostream& out) {
  out << "<section id=\"" << Escape(s.id) << "\"><h2>" << Escape(s.title) << "</h2>\n";
  if (!s.intro.empty()) out << "<p>" << Escape(s.intro) << "</p>\n";
  for (const ReportTable& t : s.tables) WriteTable(t, out);
  for (const ReportFigure& f : s.figures) WriteFigure(f, out);
  out << "</section>\n";
}

void WriteCell(std::ostream& out, const char* column, double value) {
  out << "<td class=\"n\" data-col=\"" << column << "\">" << ReportNumber(value) << "</td>";
}

void WriteInterval(std::ostream& out, const char* column, const metrics::Interval& i) {
  const std::string name(column);
  WriteCell(out, column, i.estimate);
  WriteCell(out, (name + "_low").c_str(), i.low);
  WriteCell(out, (name + "_high").c_str(), i.high);
}

// Design-aware scoring block: power and false edges per edge group, the
// method's power ceiling, mark agreement and the truths behind the intervals.
void WriteGroupCell(std::ostream& out, const SummaryLine& s, int g) {
  const char* name = metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(g));
  if (!s.reports[g]) {
    out << "<td data-col=\"" << name << "_power\">cannot report</td>";
  } else {
    const metrics::Interval& p = s.group_power[g];
    out << "<td class=\"n\" data-col=\"" << name << "_power\">" << ReportNumber(p.estimate) << " ["
        << ReportNumber(p.low) << ", " << ReportNumber(p.high) << "]</td>";
  }
  out << "<td class=\"n\">" << s.group_solid_found[g] << "/" << s.group_solid[g] << "</td><td class=\"n\">"
      << s.group_false_edges[g] << "/" << s.group_reported[g] << "</td>";
}

void WriteGroupNumbers(const ReportPage& page, std::ostream& out) {
  out << "<p>By edge group: power with its 95% interval, solid edges found / solid edges of N, false "
         "edges / reported edges; ceiling: the best pooled power the method can reach given the groups "
         "it cannot report; marks agree: of the reported edges in N, the share whose solid/dashed mark "
         "matches N's (methods that mark edges only).</p>\n<table id=\"group-table\">\n<tr><th>cell</th>"
         "<th>length</th><th>learner</th><th>truths</th><th>ceiling</th>";
  for (int g = 0; g < metrics::kEdgeGroups; ++g) {
    const char* name = metrics::EdgeGroupName(static_cast<metrics::EdgeGroup>(g));
    out << "<th>" << name << " power</th><th>found</th><th>false</th>";
  }
  out << "<th colspan=3>marks agree</th></tr>\n";
  for (const SummaryLine& s : page.summary) {
    out << "<tr data-cell=\"" << s.cell << "\" data-learner=\"" << Escape(s.learner) << "\"><td class=\"n\">"
        << s.cell << "</td>";
    WriteCell(out, "length", s.length);
    out << "<td>" << Escape(s.learner) << "</td><td class=\"n\">" << s.truths << "</td>";
    WriteCell(out, "power_ceiling", s.power_ceiling);
    for (int g = 0; g < metrics::kEdgeGroups; ++g) WriteGroupCell(out, s, g);
    WriteInterval(out, "mark_agreement", s.mark_agreement);
    out << "</tr>\n";
  }
  out << "</table>\n";
}

void WriteComparisons(const ReportPage& page, std::ostream& out) {
  if (page.comparisons.empty()) return;
  out << "<p>Paired differences, as in comparisons.csv: each learner minus an earlier learner of the "
         "study on the same replicates (same data), with 95% cluster-bootstrap intervals that keep the "
         "pairing. To choose between two methods, read these rather than the overlap of the intervals "
         "above: an interval of a difference that excludes 0 is a difference beyond the sampling error "
         "of the replicates.</p>\n<table id=\"comparison-table\">\n<tr><th>cell</th><th>length</th>"
         "<th>level</th><th>hidden</th><th>learner</th><th>minus</th><th>paired</th><th colspan=3>power</th>"
         "<th colspan=3>directed power</th><th colspan=3>false-edge rate</th>"
         "<th colspan=3>class recovered</th></tr>\n";
  for (const ComparisonLine& c : page.comparisons) {
    out << "<tr data-cell=\"" << c.cell << "\" data-learner=\"" << Escape(c.learner)
        << "\" data-reference=\"" << Escape(c.reference) << "\"><td class=\"n\">" << c.cell << "</td>";
    WriteCell(out, "length", c.length);
    WriteCell(out, "level", c.level);
    out << "<td class=\"n\">" << c.hidden_count << "</td><td>" << Escape(c.learner) << "</td><td>" << Escape(c.reference) << "</td><td class=\"n\">"
        << c.paired << "</td>";
    WriteInterval(out, "power_difference", c.power);
    WriteInterval(out, "directed_power_difference", c.directed_power);
    WriteInterval(out, "false_edge_rate_difference", c.false_edge_rate);
    WriteInterval(out, "class_recovery_difference", c.class_recovery);
    out << "</tr>\n";
  }
  out << "</table>\n";
}

void WriteNumbers(const ReportPage& page, std::ostream& out) {
  out << "<section id=\"numbers\"><h2>The numbers</h2>\n<p>As in summary.csv: pooled rates and "
         "means with 95% cluster-bootstrap intervals (truths, then replicates within truths).</p>\n"
         "<table id=\"summary-table\">\n<tr><th>cell</th><th>length</th><th>level</th><th>hidden</th>"
         "<th>learner</th><th>replicates</th><th>failed</th><th colspan=3>power</th>"
         "<th colspan=3>false-edge rate</th><th colspan=3>class recovered</th>"
         "<th colspan=3>tests made</th><th colspan=3>learner seconds</th></tr>\n";
  for (const SummaryLine& s : page.summary) {
    out << "<tr data-cell=\"" << s.cell << "\" data-learner=\"" << Escape(s.learner) << "\">"
        << "<td class=\"n\">" << s.cell << "</td>";
    WriteCell(out, "length", s.length);
    WriteCell(out, "level", s.level);
    out << "<td class=\"n\">" << s.hidden_count << "</td><td>" << Escape(s.learner) << "</td><td class=\"n\">"
        << s.replicates << "</td><td class=\"n\">" << s.failed << "</td>";
    WriteInterval(out, "power", s.power);
    WriteInterval(out, "false_edge_rate", s.false_edge_rate);
    WriteInterval(out, "class_recovery", s.class_recovery);
    WriteInterval(out, "tests", s.tests);
    WriteInterval(out, "timing_learn_seconds", s.seconds);
    out << "</tr>\n";
  }
  out << "</table>\n";
  WriteGroupNumbers(page, out);
  WriteComparisons(page, out);
  out << "</section>\n";
}

}  // namespace

std::string ReportNumber(double value) {
  if (std::isnan(value)) return "-";
  char buffer[64];
  if (std::abs(value) >= 1000 || value == std::floor(value)) {
    std::snprintf(buffer, sizeof buffer, "%.0f", value);
  } else {
    std::snprintf(buffer, sizeof buffer, "%.3f", value);
  }
  return buffer;
}

std::string InlineSvg(const std::string& svg, const std::string& prefix) {
  // Drop the prologue, doctype and comments: everything before <svg, and
  // every <!-- ... --> after it.
  const size_t start = svg.find("<svg");
  const std::string body = start == std::string::npos ? svg : svg.substr(start);
  std::string out;
  out.reserve(body.size() + body.size() / 16);
  for (size_t i = 0; i < body.size();) {
    if (body.compare(i, 4, "<!--") == 0) {
      const size_t end = body.find("-->", i + 4);
      i = end == std::string::npos ? body.size() : end + 3;
      continue;
    }
    // id="x" / id='x' (not part of a longer attribute name), href="#x", url(#x).
    const bool id = body.compare(i, 4, "id=\"") == 0 || body.compare(i, 4, "id='") == 0;
    if (id && (i == 0 || body[i - 1] == ' ' || body[i - 1] == '\n' || body[i - 1] == '\t')) {
      out.append(body, i, 4).append(prefix).append("-");
      i += 4;
      continue;
    }
    if (body.compare(i, 7, "href=\"#") == 0 || body.compare(i, 7, "href='#") == 0) {
      out.append(body, i, 7).append(prefix).append("-");
      i += 7;
      continue;
    }
    if (body.compare(i, 5, "url(#") == 0) {
      out.append("url(#").append(prefix).append("-");
      i += 5;
      continue;
    }
    out += body[i++];
  }
  return out;
}

void WriteReportHtml(const ReportPage& page, std::ostream& out) {
  out << "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
      << "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n<title>"
      << Escape(page.title) << "</title>\n<style>" << kStyle << "</style>\n</head>\n<body>\n<h1>"
      << Escape(page.title) << "</h1>\n";
  if (!page.warnings.empty()) {
    out << "<div class=\"warnings\" id=\"warnings\">\n";
    for (const std::string& w : page.warnings) out << "<p class=\"warning\">" << Escape(w) << "</p>\n";
    out << "</div>\n";
  }
  out << "<p class=\"caution\" id=\"caution\">" << Escape(page.caution)
      << "</p>\n";
  WriteStudyTable(page, out);
  for (const ReportSection& s : page.sections) WriteSection(s, out);
  WriteNumbers(page, out);
  out << "<footer><p>Written by locind from the files of this folder (summary.csv, edges.csv, "
         "null_tests.csv, plan.csv when present); columns are documented in results/README.md of "
         "the locind sources.</p></footer>\n</body>\n</html>\n";
}

}  // namespace locind::app
