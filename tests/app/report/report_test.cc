// The report end to end: a small study is run, its report written, and
//  - every number of the report's table equals summary.csv (read apart),
//  - every figure is an SVG file and sits inline in the page,
//  - headless Chromium loads the page with no errors and sees every figure
//    with a non-empty size (a screenshot is kept as a test artefact in
//    build/test-artifacts/report.png).
#include "app/report/report.h"

#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <sstream>

#include <unistd.h>

#include "app/cli/command.h"
#include "app/io/external_program.h"
#include "app/io/error.h"
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
  // power, false-edges, tests, seconds; QQ for hawkes-lr at 150 and 600;
  // truth, projection, class; 3 learners x 2 replicates learned.
  CHECK(figures == 4 + 2 + 3 + 6);
  CHECK(std::count(html.begin(), html.end(), '\n') > 100);
  // Self-contained: nothing to fetch (only XML namespace names mention http).
  for (const char* link : {"src=\"http", "href=\"http", "src='http", "href='http"}) {
    CHECK_MESSAGE(html.find(link) == std::string::npos, link);
  }
  CHECK(html.find("<script") == std::string::npos);
  CHECK(html.find("statistical hypotheses") != std::string::npos);  // the caution
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
  CHECK(r.err.find("usage: locind report DIR") != std::string::npos);
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
