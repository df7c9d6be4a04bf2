// The gnuplot scripts of the report: data, axes, targets, styles; and one
// real rendering through gnuplot.
#include "app/report/report_figures.h"

#include <doctest/doctest.h>

#include <algorithm>

namespace locind::app {
namespace {

LinePlot TwoLearners() {
  LinePlot plot;
  plot.title = "Power, it's a test";
  plot.y_label = "power";
  plot.unit_range = true;
  plot.series = {{"pairwise/oracle", 0, {{250, 0.5, 0.3, 0.7}, {4000, 0.9, 0.8, 0.95}}},
                 {"screen/hawkes-lr", 1, {{250, 0.4, 0.2, 0.6}}}};
  return plot;
}

TEST_CASE("a line plot: data blocks, bands, markers, log x for lengths spanning 16x") {
  const std::string s = LinePlotScript(TwoLearners());
  CHECK(s.find("set title 'Power, it''s a test' noenhanced") != std::string::npos);  // quote doubled
  CHECK(s.find("set logscale x") != std::string::npos);
  CHECK(s.find("set xtics ('250' 250, '4000' 4000)") != std::string::npos);
  CHECK(s.find("set yrange [-0.02:1.02]") != std::string::npos);
  // Two series are spread by +-0.6% of the log span: 250 * 16^(-0.006).
  CHECK(s.find("$s0 << EOD\n245.8") != std::string::npos);
  CHECK(s.find("$s0 using 1:3:4 with filledcurves lc rgb '#0072B2' notitle") != std::string::npos);
  CHECK(s.find("$s0 using 1:2 with linespoints lw 2 pt 7") != std::string::npos);
  // A single point gets error bars instead of a band, in the second colour and marker.
  CHECK(s.find("$s1 using 1:2:3:4 with yerrorbars lw 2 pt 5 ps 1.1 lc rgb '#D55E00' title 'screen/hawkes-lr'") !=
        std::string::npos);
}

TEST_CASE("targets and planned lengths, and log y drops values that are not positive") {
  LinePlot plot = TwoLearners();
  plot.target = 0.8;
  plot.target_label = "target 0.8";
  plot.marks = {{1, 750}};
  plot.log_y = true;
  plot.series[1].points[0].y = 0;
  const std::string s = LinePlotScript(plot);
  CHECK(s.find("set arrow from graph 0, first 0.8 to graph 1, first 0.8 nohead dt 2") != std::string::npos);
  CHECK(s.find("set label 'target 0.8'") != std::string::npos);
  CHECK(s.find("set arrow from first 750, graph 0 to first 750, graph 1 nohead dt 3 lw 1.5 lc rgb '#D55E00'") !=
        std::string::npos);
  CHECK(s.find("$s1 << EOD\nEOD") != std::string::npos);
  CHECK(s.find("set logscale y\nset format y '%g'") != std::string::npos);
}

TEST_CASE("a plot with nothing defined says so instead of failing") {
  LinePlot plot;
  plot.title = "empty";
  CHECK(LinePlotScript(plot).find("no defined values to plot") != std::string::npos);
}

TEST_CASE("QQ script: the band on every point, markers thinned to about 1000") {
  QqPlot plot;
  plot.title = "hawkes-lr, length 100";
  std::vector<double> p;
  for (int i = 0; i < 2500; ++i) p.push_back((i + 0.5) / 2500);
  plot.points = metrics::UniformQq(p);
  plot.share_at_level = 0.05;
  const std::string s = QqPlotScript(plot);
  const size_t band = s.find("$band << EOD\n"), points = s.find("$points << EOD\n"), end = s.find("EOD\nplot");
  REQUIRE(band != std::string::npos);
  REQUIRE(points != std::string::npos);
  const auto lines = [&s](size_t from, size_t to) { return std::count(s.begin() + from, s.begin() + to, '\n'); };
  CHECK(lines(band, points) == 2500 + 2);  // header, rows, EOD
  CHECK(lines(points, end) == 834 + 1);  // every 3rd of 2500: 0, 3, ..., 2499 (the last), header
  CHECK(s.find("title '2500 tests, 5% at p <= 0.05'") != std::string::npos);
}

TEST_CASE("gnuplot renders a script to an SVG document") {
  const Result<std::string> svg = RenderGnuplot(LinePlotScript(TwoLearners()));
  REQUIRE_MESSAGE(svg.ok(), (svg.ok() ? "" : svg.status().message()));
  CHECK(svg->find("<svg") != std::string::npos);
  CHECK(svg->find("pairwise/oracle") != std::string::npos);
  const Result<std::string> bad = RenderGnuplot("plot $nothing using 1:2\n");
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.status().message().find("gnuplot failed") == 0);
}

// Stacked bars: each part drawn from the running total of the parts below
// it, zero parts left out, a category that never occurs has no legend entry.
TEST_CASE("stacked bars: parts stacked bottom up, empty categories not in the legend") {
  StackedBarPlot plot;
  plot.title = "Where edges are lost";
  plot.y_label = "edges per replicate";
  plot.categories = {{"own", "#D55E00"}, {"never", "#000000"}, {"reach", "#AAAAAA"}};
  plot.bars = {{-0.2, "missed", {1.5, 0, 0.5}}, {0.2, "false", {0.25, 0, 0}}};
  plot.group_labels = {{0, "length 4000"}};
  const std::string s = StackedBarScript(plot);
  // Category 0: bar 1 from 0 to 1.5, bar 2 from 0 to 0.25; category 2 on top of 1.5.
  CHECK(s.find("$c0 << EOD\n-0.2 0 1.5\n0.2 0 0.25\nEOD\n") != std::string::npos);
  CHECK(s.find("$c1 << EOD\nEOD\n") != std::string::npos);
  CHECK(s.find("$c2 << EOD\n-0.2 1.5 2\nEOD\n") != std::string::npos);
  CHECK(s.find("title 'own'") != std::string::npos);
  CHECK(s.find("title 'never'") == std::string::npos);
  CHECK(s.find("$c2 using 1:3:($1-0.18):($1+0.18):2:3 with boxxyerror lc rgb '#AAAAAA' title 'reach'") !=
        std::string::npos);
  CHECK(s.find("set xtics scale 0 ('missed' -0.2, 'false' 0.2)") != std::string::npos);
  CHECK(s.find("set label 'length 4000' at first 0, graph 0 center") != std::string::npos);
  CHECK(s.find("set yrange [0:2.16]") != std::string::npos);  // tallest bar 2, 8% headroom
  const Result<std::string> svg = RenderGnuplot(s);
  REQUIRE_MESSAGE(svg.ok(), (svg.ok() ? "" : svg.status().message()));
  CHECK(svg->find("reach") != std::string::npos);
  // Nothing lost: a message instead of bars, still a valid script.
  plot.bars = {{0, "missed", {0, 0, 0}}};
  const std::string empty = StackedBarScript(plot);
  CHECK(empty.find("no missed solid edge and no false edge") != std::string::npos);
  CHECK(RenderGnuplot(empty).ok());
}

}  // namespace
}  // namespace locind::app
