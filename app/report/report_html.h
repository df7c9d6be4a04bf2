// The HTML page of a study report: one self-contained file (inline SVG and
// CSS, no script, nothing fetched from the network).
#pragma once

#include <ostream>
#include <string>
#include <utility>
#include <vector>

#include "app/results/results_reader.h"

namespace locind::app {

enum class Renderer { kGnuplot, kGraphviz };

struct ReportFigure {
  std::string id;       // unique in the page; also the file name figures/<id>.svg
  std::string title;
  std::string caption;  // plain text
  Renderer renderer = Renderer::kGnuplot;
  std::string source;   // the gnuplot script or the DOT text
  std::string svg;      // the SVG document, once rendered
};

// A table of text cells inside a section (numbers already formatted).
struct ReportTable {
  std::string id;
  std::string caption;                // plain text
  std::vector<std::string> columns;   // machine names: each cell's data-col
  std::vector<std::string> header;    // what the header row shows
  struct Row {
    std::string key;                  // the row's data-key
    bool flagged = false;             // drawn as a warning
    std::vector<std::string> cells;
  };
  std::vector<Row> rows;
};

struct ReportSection {
  std::string id;
  std::string title;
  std::string intro;  // plain text paragraph, may be empty
  std::vector<ReportFigure> figures;
  std::vector<ReportTable> tables = {};  // shown after the intro, before the figures
};

struct ReportPage {
  std::string title;
  std::vector<std::pair<std::string, std::string>> study;  // the study in one table
  std::vector<ReportSection> sections;
  std::vector<SummaryLine> summary;  // the numbers table, as read from summary.csv
  std::vector<ComparisonLine> comparisons;  // paired differences, from comparisons.csv
  std::string caution;               // plain text
  std::vector<std::string> warnings = {};  // plain text lines shown first, above the caution
};

// Writes the page. Text is escaped; SVG documents lose their XML prologue
// and get their ids prefixed with the figure id, so figures in one page
// never share an id.
void WriteReportHtml(const ReportPage& page, std::ostream& out);

// `svg` ready to sit inside HTML: prologue, doctype and comments dropped,
// every id (and reference to one) prefixed with `prefix` + "-".
std::string InlineSvg(const std::string& svg, const std::string& prefix);

// How the numbers table shows a value: three decimals, "-" when undefined.
std::string ReportNumber(double value);

}  // namespace locind::app
