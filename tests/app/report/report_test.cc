// The report end to end: a small study is run, its report written, and
//  - every number of the report's table equals summary.csv (read apart),
//  - the calibration table equals calibration.csv, and a folder whose
//    true-null p-values are made small gets a warning line per group,
//  - every figure is an SVG file and sits inline in the page,
//  - the bars of "where edges are lost" add up to summary.csv's counts,
//  - headless Chromium loads the page with no errors and sees every figure
//    with a non-empty size (a screenshot is kept as a test artefact in
//    build/test-artifacts/report.png).
#include "app/report/report.h"

#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <algorithm>
#include <cstdio>
#include <map>
#include <set>
#include <sstream>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/external_program.h"
#include "app/io/error.h"
#include "app/report/lost_edges_figure.h"
#include "tests/app/command_fixture.h"
#include "tests/app/run_folders.h"

namespace locind::app {
namespace {

namespace fs = std::filesystem;

// Two observed streams driven by one hidden one, plus a chain: the Hawkes
// test has true nulls to calibrate and the class has solid and dashed edges.
const char kStudy[] =
    "name: report_check\n"
    "seed: 5\n"
    "truth:\n"
    "  nodes: [a, b, c, h]\n"
    "  edges: [a -> b, h -> b, h -> c, a -> a, b -> b, h -> h]\n"
    "  hidden: [h]\n"
    "process:\n"
    "  events: {baseline: 0.4, weight: 0.4, decay: 2, spectral_radius: 0.5, burn_in: 20}\n"
    "grid:\n"
    "  lengths: [150, 600]\n"
    "  replicates: 3\n"
    "learners:\n"
    "  - {method: pairwise, test: hawkes-lr}\n"
    "  - {method: maximal-search, test: hawkes-lr}\n"
    "  - {method: maximal-search, test: oracle}\n";

using testing::ReadAll;

// Runs the study once per process (ctest runs each test case as its own
// process, several at a time, so each gets its own folder, removed at exit).
struct StudyRun {
  fs::path dir = fs::temp_directory_path() / ("locind_report_test_" + std::to_string(::getpid()));
  StudyRun() {
    fs::remove_all(dir);
    fs::create_directories(dir);
    std::ofstream(dir / "study.yaml") << kStudy;
    const testing::Outcome run =
        testing::RunHandler(RunRunCommand, {(dir / "study.yaml").string(), "--out", (dir / "out").string()});
    REQUIRE_MESSAGE(run.code == kExitOk, run.err);
    CHECK(run.out.find("report in ") != std::string::npos);
  }
  ~StudyRun() { fs::remove_all(dir); }
};

fs::path StudyFolder() {
  static const StudyRun run;
  return run.dir / "out";
}

std::vector<std::string> Split(const std::string& line) {
  std::vector<std::string> out;
  std::stringstream s(line);
  for (std::string f; std::getline(s, f, ',');) out.push_back(f);
  if (!line.empty() && line.back() == ',') out.push_back("");
  return out;
}

// The rows of one of our CSV files as column -> value.
std::vector<std::map<std::string, std::string>> CsvRows(const fs::path& path) {
  std::istringstream csv(ReadAll(path));
  std::string line;
  std::getline(csv, line);
  const std::vector<std::string> header = Split(line);
  std::vector<std::map<std::string, std::string>> rows;
  while (std::getline(csv, line)) {
    const std::vector<std::string> f = Split(line);
    REQUIRE(f.size() == header.size());
    rows.emplace_back();
    for (size_t i = 0; i < header.size(); ++i) rows.back()[header[i]] = f[i];
  }
  return rows;
}

// The text of the cell `column` in the first table row whose data-key is `key`.
std::string TableCell(const std::string& html, const std::string& key, const std::string& column) {
  const size_t at = html.find("data-key=\"" + key + "\"");
  if (at == std::string::npos) return "(no row " + key + ")";
  const std::string row = html.substr(at, html.find("</tr>", at) - at);
  const std::string mark = "data-col=\"" + column + "\">";
  const size_t start = row.find(mark);
  if (start == std::string::npos) return "(no column " + column + ")";
  const size_t from = start + mark.size();
  return row.substr(from, row.find('<', from) - from);
}

TEST_CASE("every number in the report's table equals summary.csv") {
  const std::string html = ReadAll(StudyFolder() / "report.html");
  std::istringstream csv(ReadAll(StudyFolder() / "summary.csv"));
  std::string line;
  std::getline(csv, line);
  const std::vector<std::string> header = Split(line);
  int rows = 0, compared = 0;
  while (std::getline(csv, line)) {
    const std::vector<std::string> f = Split(line);
    std::map<std::string, std::string> value;
    for (size_t i = 0; i < header.size(); ++i) value[header[i]] = f[i];
    // The table row of this cell and learner.
    const std::string key = "data-cell=\"" + value["cell"] + "\" data-learner=\"" + value["learner"] + "\"";
    const size_t at = html.find(key);
    REQUIRE_MESSAGE(at != std::string::npos, key);
    const std::string row = html.substr(at, html.find("</tr>", at) - at);
    ++rows;
    for (const char* column : {"length", "level", "power", "power_low", "power_high", "false_edge_rate",
                               "false_edge_rate_low", "false_edge_rate_high", "class_recovery",
                               "class_recovery_low", "class_recovery_high", "tests", "tests_low",
                               "tests_high"}) {
      const std::string mark = std::string("data-col=\"") + column + "\">";
      const size_t start = row.find(mark);
      REQUIRE_MESSAGE(start != std::string::npos, column);
      const size_t from = start + mark.size();
      const std::string shown = row.substr(from, row.find('<', from) - from);
      if (value[column].empty()) {
        CHECK_MESSAGE(shown == "-", column);
      } else {
        // The page rounds to three decimals (whole numbers and values of
        // 1000 or more to units).
        const double exact = std::stod(value[column]);
        const double rounding = std::abs(exact) >= 1000 ? 0.5 : 5e-4;
        CHECK_MESSAGE(std::abs(std::stod(shown) - exact) <= rounding + 1e-12, column);
      }
      ++compared;
    }
  }
  CHECK(rows == 6);  // 2 lengths x 3 learners
  CHECK(compared == 6 * 14);
}

TEST_CASE("the edge-group table shows summary.csv's ceiling and mark agreement") {
  const std::string html = ReadAll(StudyFolder() / "report.html");
  const size_t table = html.find("id=\"group-table\"");
  REQUIRE(table != std::string::npos);
  std::istringstream csv(ReadAll(StudyFolder() / "summary.csv"));
  std::string line;
  std::getline(csv, line);
  const std::vector<std::string> header = Split(line);
  int compared = 0;
  while (std::getline(csv, line)) {
    const std::vector<std::string> f = Split(line);
    std::map<std::string, std::string> value;
    for (size_t i = 0; i < header.size(); ++i) value[header[i]] = f[i];
    const std::string key = "data-cell=\"" + value["cell"] + "\" data-learner=\"" + value["learner"] + "\"";
    const size_t at = html.find(key, table);
    REQUIRE_MESSAGE(at != std::string::npos, key);
    const std::string row = html.substr(at, html.find("</tr>", at) - at);
    for (const char* column : {"power_ceiling", "mark_agreement", "mark_agreement_low", "mark_agreement_high"}) {
      const std::string mark = std::string("data-col=\"") + column + "\">";
      const size_t start = row.find(mark);
      REQUIRE_MESSAGE(start != std::string::npos, column);
      const size_t from = start + mark.size();
      const std::string shown = row.substr(from, row.find('<', from) - from);
      if (value[column].empty()) {
        CHECK_MESSAGE(shown == "-", column);
      } else {
        CHECK_MESSAGE(std::abs(std::stod(shown) - std::stod(value[column])) <= 5e-4 + 1e-12, column);
      }
      ++compared;
    }
    // A group the method cannot report says so instead of a number.
    if (value["reports_bidirected"] == "no") CHECK(row.find("cannot report") != std::string::npos);
  }
  CHECK(compared == 6 * 4);
}

TEST_CASE("the paired-difference table equals comparisons.csv") {
  const std::string html = ReadAll(StudyFolder() / "report.html");
  const size_t table = html.find("id=\"comparison-table\"");
  REQUIRE(table != std::string::npos);
  int compared = 0;
  const auto rows = CsvRows(StudyFolder() / "comparisons.csv");
  for (const auto& value : rows) {
    const std::string key = "data-cell=\"" + value.at("cell") + "\" data-learner=\"" + value.at("learner") +
                            "\" data-reference=\"" + value.at("reference") + "\"";
    const size_t at = html.find(key, table);
    REQUIRE_MESSAGE(at != std::string::npos, key);
    const std::string row = html.substr(at, html.find("</tr>", at) - at);
    for (const std::string measure : {"power", "directed_power", "false_edge_rate", "class_recovery"}) {
      for (const std::string end : {"", "_low", "_high"}) {
        const std::string column = measure + "_difference" + end;
        const std::string mark = "data-col=\"" + column + "\">";
        const size_t start = row.find(mark);
        REQUIRE_MESSAGE(start != std::string::npos, column);
        const size_t from = start + mark.size();
        const std::string shown = row.substr(from, row.find('<', from) - from);
        if (value.at(column).empty()) {
          CHECK_MESSAGE(shown == "-", column);
        } else {
          CHECK_MESSAGE(std::abs(std::stod(shown) - std::stod(value.at(column))) <= 5e-4 + 1e-12, column);
        }
        ++compared;
      }
    }
  }
  CHECK(rows.size() == 2 * 3);  // 2 lengths x 3 pairs of 3 learners
  CHECK(compared == 6 * 12);
}

TEST_CASE("every figure is a non-empty SVG file and sits in the page") {
  const std::string html = ReadAll(StudyFolder() / "report.html");
  int figures = 0;
  for (const auto& entry : fs::directory_iterator(StudyFolder() / "figures")) {
    const std::string id = entry.path().stem().string();
    const std::string svg = ReadAll(entry.path());
    CHECK_MESSAGE(svg.find("<svg") != std::string::npos, id);
    CHECK_MESSAGE(html.find("<figure id=\"" + id + "\">") != std::string::npos, id);
    ++figures;
  }
  // power, false-edges, tests, seconds; power per edge group (the class has
  // solid directed edges, loops and b <-> c from the hidden h: 3 panels); one
  // QQ plot per row of calibration.csv (one level: test, length and tag);
  // truth, projection, class; 3 learners x 2 replicates learned; where edges
  // are lost, one figure per learner.
  const std::vector<std::map<std::string, std::string>> groups = CsvRows(StudyFolder() / "calibration.csv");
  // hawkes-lr at 150 and 600; target a (parents: a only) gives "yes" rows,
  // targets b and c (b <-> c through h) only "no" rows.
  CHECK(groups.size() >= 2);
  CHECK(groups.size() <= 4);
  for (const auto& g : groups) {
    const std::string id = "qq-hawkes-lr-" + g.at("length") +
                           (g.at("all_parents_given") == "yes" ? "-parents-given" : "-parent-missing");
    CHECK_MESSAGE(fs::exists(StudyFolder() / "figures" / (id + ".svg")), id);
  }
  CHECK(figures == 4 + 3 + static_cast<int>(groups.size()) + 3 + 6 + 3);
  for (const char* lost : {"lost-pairwise-hawkes-lr", "lost-maximal-search-hawkes-lr", "lost-maximal-search-oracle"}) {
    CHECK_MESSAGE(fs::exists(StudyFolder() / "figures" / (std::string(lost) + ".svg")), lost);
  }
  for (const char* group : {"power-directed", "power-loop", "power-bidirected"}) {
    CHECK_MESSAGE(fs::exists(StudyFolder() / "figures" / (std::string(group) + ".svg")), group);
  }
  CHECK(std::count(html.begin(), html.end(), '\n') > 100);
  // Self-contained: nothing to fetch (only XML namespace names mention http).
  for (const char* link : {"src=\"http", "href=\"http", "src='http", "href='http"}) {
    CHECK_MESSAGE(html.find(link) == std::string::npos, link);
  }
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("statistical hypotheses") != std::string::npos);  // the caution
  // It names each test of the study once, with what the test assumes.
  const bool named = html.find("Tests in this study: hawkes-lr (b&#39;s intensity is a linear Hawkes") !=
                         std::string::npos ||
                     html.find("Tests in this study: hawkes-lr (b's intensity is a linear Hawkes") !=
                         std::string::npos;
  CHECK(named);
  CHECK(html.find("; oracle (answers from the truth") != std::string::npos);
  const size_t caution_at = html.find("id=\"caution\"");
  const std::string caution = html.substr(caution_at, html.find("</p>", caution_at) - caution_at);
  CHECK(caution.find("hawkes-lr (") == caution.rfind("hawkes-lr ("));  // named once, though two learners use it
}

// The bars of "where edges are lost", built from the folder as the report
// builds them, add up to summary.csv's missed solid and false edges per
// replicate that ran, for every learner and length; the propagated missed
// edges are all found in edges.csv with their rule (nothing left over).
TEST_CASE("where edges are lost: the bars add up to summary.csv") {
  const Result<ReportData> data = ReadReportData(StudyFolder().string());
  REQUIRE(data.ok());
  int lines = 0;
  int missed_total = 0;
  for (const SummaryLine& s : data->summary) {
    REQUIRE(s.has_attribution);
    const LostCounts c = CountLost(s, data->edges);
    int split = 0;
    for (const EdgeLine& e : data->edges) {
      split += e.cell == s.cell && e.learner == s.learner && !e.reported && e.error_cause == "propagation";
    }
    CHECK(split == s.missed_propagation);
    const StackedBarPlot plot = LostEdgesPlot(s.learner, "t", {&s}, data->edges);
    REQUIRE(plot.bars.size() == 2);
    double missed = 0, false_edges = 0;
    for (double v : plot.bars[0].parts) missed += v;
    for (double v : plot.bars[1].parts) false_edges += v;
    const int ran = s.replicates - s.failed;
    REQUIRE(ran > 0);
    CHECK(missed == doctest::Approx(double(s.solid - s.solid_found) / ran));
    CHECK(false_edges == doctest::Approx(double(s.false_edges) / ran));
    if (s.learner == "maximal-search/oracle") CHECK(c.missed[static_cast<size_t>(LostCause::kReach)] == 0);
    missed_total += s.solid - s.solid_found;
    ++lines;
  }
  CHECK(lines == 6);
  CHECK(missed_total > 0);  // not vacuous: short windows lose edges
}

TEST_CASE("the calibration table equals calibration.csv, with no warning unless a row is above the level") {
  const std::string html = ReadAll(StudyFolder() / "report.html");
  REQUIRE(html.find("<table id=\"calibration-table\">") != std::string::npos);
  int warned = 0;
  for (const auto& g : CsvRows(StudyFolder() / "calibration.csv")) {
    const std::string key = g.at("test") + "|" + g.at("length") + "|" + g.at("level") + "|" + g.at("all_parents_given");
    CHECK(g.at("test") == "hawkes-lr");
    CHECK(g.at("level") == "0.05");
    CHECK(TableCell(html, key, "tests") == g.at("tests"));
    CHECK(TableCell(html, key, "rejected") == g.at("rejected"));
    CHECK(std::stoi(g.at("tests")) > 0);
    for (const char* column : {"rejected_share", "rejected_share_low", "rejected_share_high"}) {
      // The page shows three decimals.
      CHECK_MESSAGE(std::abs(std::stod(TableCell(html, key, column)) - std::stod(g.at(column))) <= 5e-4 + 1e-12,
                    column);
    }
    // above_level: the exact interval lies above the level.
    CHECK(g.at("above_level") == (std::stod(g.at("rejected_share_low")) > 0.05 ? "yes" : "no"));
    if (g.at("above_level") == "yes") ++warned;
  }
  size_t count = 0;
  for (size_t at = html.find("<p class=\"warning\">"); at != std::string::npos;
       at = html.find("<p class=\"warning\">", at + 1)) {
    ++count;
  }
  CHECK(count == static_cast<size_t>(warned));
}

TEST_CASE("true-null tests that reject too often get a warning at the top of the report") {
  // A copy of the run whose true-null p-values at length 600 are all 0.001:
  // every group there rejects n of n tests.
  const fs::path dir = StudyFolder().parent_path() / "too-many-rejections";
  fs::remove_all(dir);
  fs::copy(StudyFolder(), dir, fs::copy_options::recursive);
  std::istringstream in(ReadAll(dir / "null_tests.csv"));
  std::string line;
  std::getline(in, line);
  const std::vector<std::string> header = Split(line);
  const size_t p_column = std::find(header.begin(), header.end(), "test_p_value") - header.begin();
  REQUIRE(p_column < header.size());
  std::string doctored = line + "\n";
  // Distinct queries per tag at length 600 (a query of one data set once).
  std::map<std::string, std::set<std::string>> distinct;
  while (std::getline(in, line)) {
    std::vector<std::string> f = Split(line);
    std::map<std::string, std::string> v;
    for (size_t i = 0; i < header.size(); ++i) v[header[i]] = f[i];
    if (v["length"] == "600") {
      f[p_column] = "0.001";
      distinct[v["all_parents_given"]].insert(v["cell"] + "/" + v["replicate"] + "/" + v["test_target"] + "/" +
                                              v["test_sources"] + "/" + v["test_given"]);
    }
    std::string joined;
    for (size_t i = 0; i < f.size(); ++i) joined += (i ? "," : "") + f[i];
    doctored += joined + "\n";
  }
  std::ofstream(dir / "null_tests.csv") << doctored;
  REQUIRE_FALSE(distinct.empty());
  const testing::Outcome r = testing::RunHandler(RunReportCommand, {dir.string()});
  REQUIRE_MESSAGE(r.code == kExitOk, r.err);
  const std::string html = ReadAll(dir / "report.html");
  // The warnings come first: before the caution.
  const size_t warnings = html.find("<div class=\"warnings\" id=\"warnings\">");
  REQUIRE(warnings != std::string::npos);
  CHECK(warnings < html.find("id=\"caution\""));
  for (const auto& [tag, queries] : distinct) {
    const size_t n = queries.size();
    // n of n rejected: the Clopper-Pearson lower bound is (0.025)^(1/n),
    // the upper bound 1 (Clopper & Pearson 1934; the Beta(n, 1) quantile).
    char low[32];
    std::snprintf(low, sizeof low, "%.3f", std::pow(0.025, 1.0 / static_cast<double>(n)));
    const std::string expected = "<p class=\"warning\">Too many rejections under true nulls: hawkes-lr at length "
                                 "600, level 0.05, all parents given: " + tag + ": " + std::to_string(n) + " of " +
                                 std::to_string(n) + " true-null tests rejected (share 1.000, exact 95% interval " +
                                 low + " to 1.000).</p>";
    const bool flagged = html.find("<tr data-key=\"hawkes-lr|600|0.05|" + tag + "\" class=\"flagged\">") !=
                         std::string::npos;
    if (n < 2) {  // 1 of 1: the interval [0.025, 1] reaches below the level
      CHECK(html.find(expected) == std::string::npos);
      CHECK_FALSE(flagged);
      continue;
    }
    CHECK_MESSAGE(html.find(expected) != std::string::npos, expected);
    CHECK(flagged);  // and the row is marked in the table
  }
  fs::remove_all(dir);
}

TEST_CASE("a folder that is not a finished run is refused with exit code 2 and no report") {
  const fs::path dir = fs::temp_directory_path() / ("locind_report_test_bad_" + std::to_string(::getpid()));
  fs::remove_all(dir);
  fs::create_directories(dir / "input");
  testing::Outcome r = testing::RunHandler(RunReportCommand, {dir.string()});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "locind report: " + (dir / "input").string() +
                     ": expected exactly one study file (written by locind run)\n");
  std::ofstream(dir / "input" / "study.yaml") << kStudy;
  r = testing::RunHandler(RunReportCommand, {dir.string()});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "locind report: " + (dir / "summary.csv").string() +
                     ": cannot open the file (is this the folder of a finished locind run?)\n");
  CHECK_FALSE(fs::exists(dir / "report.html"));
  r = testing::RunHandler(RunReportCommand, {});
  CHECK(r.code == kExitInputError);
  CHECK(r.err == "locind report: missing DIR (the result folder)\n");
  fs::remove_all(dir);
}

// Chromium checks the page from the inside: a copy of the page gets a
// script (first thing in <head>) that counts load errors and measures each
// figure once the page has loaded, and writes the result into the DOM that
// --dump-dom prints.
const char kCheckScript[] =
    "<script>window.__errors=[];window.addEventListener('error',function(e){window.__errors.push("
    "String(e.message||e.type))},true);window.addEventListener('load',function(){var figs=document."
    "querySelectorAll('figure');var bad=[];figs.forEach(function(f){var s=f.querySelector('svg');var r="
    "s?s.getBoundingClientRect():{width:0,height:0};var marks=s?s.querySelectorAll('path,polygon,ellipse,"
    "polyline,use,text').length:0;if(!(r.width>50&&r.height>50&&marks>0))bad.push(f.id)});var p=document."
    "createElement('pre');p.id='check-result';p.textContent='figures='+figs.length+' bad=['+bad.join(';')"
    "+'] errors='+window.__errors.length;document.body.appendChild(p)});</script>";

TEST_CASE("headless Chromium loads the report with no errors and every figure drawn") {
  const fs::path dir = StudyFolder();
  std::string page = ReadAll(dir / "report.html");
  const size_t head = page.find("<head>");
  REQUIRE(head != std::string::npos);
  page.insert(head + 6, kCheckScript);
  std::ofstream(dir / "report-check.html") << page;
  const int figures = static_cast<int>(std::distance(fs::directory_iterator(dir / "figures"), fs::directory_iterator()));

  const std::vector<std::string> flags = {
      "chromium", "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync", "--disable-dev-shm-usage",
      "--user-data-dir=" + (dir / "chromium-profile").string(), "--virtual-time-budget=5000"};
  std::vector<std::string> dump = flags;
  dump.push_back("--dump-dom");
  dump.push_back("file://" + (dir / "report-check.html").string());
  const Result<ProgramOutput> dom = RunProgram(dump);
  REQUIRE_MESSAGE(dom.ok(), (dom.ok() ? "" : dom.status().message()));
  REQUIRE_MESSAGE(dom->exit_code == 0, dom->err);
  CHECK(dom->out.find("figures=" + std::to_string(figures) + " bad=[] errors=0") != std::string::npos);

  fs::create_directories("build/test-artifacts");
  std::vector<std::string> shot = flags;
  shot.push_back("--window-size=1200,4000");
  shot.push_back("--screenshot=" + fs::absolute("build/test-artifacts/report.png").string());
  shot.push_back("file://" + (dir / "report.html").string());
  const Result<ProgramOutput> png = RunProgram(shot);
  REQUIRE(png.ok());
  CHECK(png->exit_code == 0);
  CHECK(fs::file_size("build/test-artifacts/report.png") > 10000);
}

}  // namespace
}  // namespace locind::app
