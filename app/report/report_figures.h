// The plots of a study report as gnuplot scripts, and their rendering to SVG
// by gnuplot (Debian package gnuplot-nox).
//
// Our visual language: one colour and one marker per learner (the
// Okabe & Ito 2008 colour-blind-safe set, in study order, with distinct
// filled markers so the lines read in grey too), a translucent band of the
// same colour for each 95% interval, targets as grey dashed lines, planned
// lengths as dotted vertical lines in the learner's colour, a learner's
// power ceiling as a dash-dot horizontal line in its colour. Points of
// different learners at one length are spread a little sideways so equal
// values do not hide each other.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "base/status.h"
#include "metrics/pvalue_calibration.h"

namespace locind::app {

struct PlotPoint {
  double x = 0;
  double y = 0;
  double low = 0;   // interval; equal to y when there is none
  double high = 0;
};

struct PlotSeries {
  std::string label;
  int style = 0;  // index of the learner: picks colour and marker
  std::vector<PlotPoint> points;  // sorted by x; undefined (NaN) y left out
};

struct LinePlot {
  std::string title;
  std::string x_label = "observation length";
  std::string y_label;
  bool unit_range = false;  // y in [0, 1] (rates); otherwise automatic
  bool log_y = false;
  std::vector<PlotSeries> series;
  std::optional<double> target;  // horizontal target line
  std::string target_label;
  // Vertical marks: (series style, x), e.g. the planned length of a learner.
  std::vector<std::pair<int, double>> marks;
  // Horizontal dash-dot lines in a learner's colour: (series style, y), e.g.
  // the best power a method can reach given the edges it cannot report.
  std::vector<std::pair<int, double>> ceilings;
};

struct QqPlot {
  std::string title;
  std::vector<metrics::QqPoint> points;  // all of them; the plot thins to 1000
  double share_at_level = 0;             // share of p-values <= level
  double level = 0.05;
};

// Stacked bars: each bar a sum of parts, one part per category (colour and
// legend entry), drawn bottom up in category order; zero parts are skipped.
struct StackCategory {
  std::string label;
  std::string colour;  // "#rrggbb"
};

struct StackedBar {
  double x = 0;               // centre; bars are 0.36 wide
  std::string tic;            // text under the bar
  std::vector<double> parts;  // one per category (missing ones count as 0)
};

struct StackedBarPlot {
  std::string title;
  std::string y_label;
  std::vector<StackCategory> categories;
  std::vector<StackedBar> bars;
  // Text centred under a group of bars (e.g. the length), below the tics.
  std::vector<std::pair<double, std::string>> group_labels;
};

// The colour of learner style `i` ("#rrggbb").
std::string StyleColour(int style);

// gnuplot scripts writing one SVG document to standard output.
std::string LinePlotScript(const LinePlot& plot);
std::string QqPlotScript(const QqPlot& plot);
std::string StackedBarScript(const StackedBarPlot& plot);

// Runs gnuplot on `script`; the SVG text, or an error naming what failed
// (gnuplot missing, or its own message).
Result<std::string> RenderGnuplot(const std::string& script);

}  // namespace locind::app
