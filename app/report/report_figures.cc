#include "app/report/report_figures.h"

#include <algorithm>
#include <cmath>
#include <set>
#include <sstream>

#include "app/io/external_program.h"
#include "app/results/results_rows.h"

namespace locind::app {
namespace {

// Okabe & Ito (2008) colour-blind-safe colours, the light yellow left out
// (too pale on white), and filled gnuplot markers: circle, square, up
// triangle, down triangle, diamond, then the open forms.
constexpr const char* kColours[] = {"#0072B2", "#D55E00", "#009E73", "#CC79A7",
                                    "#E69F00", "#56B4E9", "#000000"};
constexpr int kMarkers[] = {7, 5, 9, 11, 13, 6, 4, 8, 10, 12};

// Two line plots or three QQ plots fit side by side in the page.
constexpr char kLineTerminal[] = "set terminal svg size 500,380 fixed font 'Helvetica,11' background rgb 'white'\n";
constexpr char kQqTerminal[] = "set terminal svg size 330,370 fixed font 'Helvetica,10' background rgb 'white'\n";
constexpr char kHeader[] =
    "set encoding utf8\n"
    "set border 3 lw 1 lc rgb '#555555'\n"
    "set xtics nomirror\nset ytics nomirror\n"
    "set grid lc rgb '#dddddd'\n"
    "set key below horizontal noenhanced\n"
    "set style fill transparent solid 0.18 noborder\n";

// A gnuplot string literal (single quotes; a quote is doubled).
std::string Quote(const std::string& text) {
  std::string out = "'";
  for (char c : text) out += c == '\'' ? std::string("''") : std::string(1, c);
  return out + "'";
}

int Marker(int style) { return kMarkers[style % static_cast<int>(std::size(kMarkers))]; }

// Distinct x values over every series.
std::vector<double> Lengths(const LinePlot& plot) {
  std::set<double> xs;
  for (const PlotSeries& s : plot.series) {
    for (const PlotPoint& p : s.points) xs.insert(p.x);
  }
  return {xs.begin(), xs.end()};
}

// Axis settings: log x when the lengths span a factor of 8 or more, tics at
// the lengths themselves.
void WriteXAxis(std::ostream& o, const std::vector<double>& xs, bool& log_x) {
  log_x = xs.size() > 1 && xs.front() > 0 && xs.back() / xs.front() >= 8;
  if (log_x) o << "set logscale x\n";
  if (!xs.empty() && xs.size() <= 12) {
    o << "set xtics (";
    for (size_t i = 0; i < xs.size(); ++i) o << (i ? ", " : "") << Quote(Num(xs[i])) << " " << Num(xs[i]);
    o << ")\n";
  }
  if (xs.size() == 1) {
    o << "set xrange [" << Num(xs[0] * 0.8) << ":" << Num(xs[0] * 1.2) << "]\n";
  } else if (xs.size() > 1) {
    const double pad = log_x ? 0 : 0.06 * (xs.back() - xs.front());
    const double lo = log_x ? xs.front() / 1.25 : xs.front() - pad;
    const double hi = log_x ? xs.back() * 1.25 : xs.back() + pad;
    o << "set xrange [" << Num(lo) << ":" << Num(hi) << "]\n";
  }
}

// Sideways offset of series i of n at x, a small share of the axis.
double Dodge(double x, int i, int n, const std::vector<double>& xs, bool log_x) {
  if (n < 2) return x;
  const double shift = (i - (n - 1) / 2.0) * 0.012;
  if (log_x) return x * std::exp(shift * std::log(xs.back() / xs.front()));
  const double span = xs.size() > 1 ? xs.back() - xs.front() : x;
  return x + shift * span;
}

}  // namespace

std::string StyleColour(int style) { return kColours[style % static_cast<int>(std::size(kColours))]; }

std::string LinePlotScript(const LinePlot& plot) {
  std::ostringstream o;
  o << kLineTerminal << kHeader << "set title " << Quote(plot.title) << " noenhanced\n"
    << "set xlabel " << Quote(plot.x_label) << "\nset ylabel " << Quote(plot.y_label) << "\n";
  const std::vector<double> xs = Lengths(plot);
  bool log_x = false;
  WriteXAxis(o, xs, log_x);
  if (plot.unit_range) o << "set yrange [-0.02:1.02]\n";
  if (plot.log_y) o << "set logscale y\nset format y '%g'\n";
  if (plot.target) {
    o << "set arrow from graph 0, first " << Num(*plot.target) << " to graph 1, first " << Num(*plot.target)
      << " nohead dt 2 lw 1.5 lc rgb '#555555' front\n"
      << "set label " << Quote(plot.target_label) << " at graph 0.01, first " << Num(*plot.target)
      << " offset 0,0.6 tc rgb '#555555' front noenhanced\n";
  }
  for (const auto& [style, x] : plot.marks) {
    o << "set arrow from first " << Num(x) << ", graph 0 to first " << Num(x) << ", graph 1 nohead dt 3 lw 1.5 lc rgb "
      << Quote(StyleColour(style)) << "\n";
  }
  for (const auto& [style, y] : plot.ceilings) {
    o << "set arrow from graph 0, first " << Num(y) << " to graph 1, first " << Num(y)
      << " nohead dt 4 lw 1.5 lc rgb " << Quote(StyleColour(style)) << " back\n";
  }
  const int n = static_cast<int>(plot.series.size());
  std::vector<std::string> layers;
  for (int i = 0; i < n; ++i) {
    const PlotSeries& s = plot.series[i];
    if (s.points.empty()) continue;
    o << "$s" << i << " << EOD\n";
    for (const PlotPoint& p : s.points) {
      if (plot.log_y && !(p.y > 0)) continue;
      const double low = plot.log_y ? std::max(p.low, p.y * 1e-3) : p.low;
      o << Num(Dodge(p.x, i, n, xs, log_x)) << " " << Num(p.y) << " " << Num(low) << " " << Num(p.high) << "\n";
    }
    o << "EOD\n";
    const std::string colour = "lc rgb " + Quote(StyleColour(s.style));
    const std::string data = "$s" + std::to_string(i);
    if (s.points.size() > 1) {
      layers.push_back(data + " using 1:3:4 with filledcurves " + colour + " notitle");
      layers.push_back(data + " using 1:2 with linespoints lw 2 pt " + std::to_string(Marker(s.style)) +
                       " ps 1.1 " + colour + " title " + Quote(s.label));
    } else {
      layers.push_back(data + " using 1:2:3:4 with yerrorbars lw 2 pt " + std::to_string(Marker(s.style)) +
                       " ps 1.1 " + colour + " title " + Quote(s.label));
    }
  }
  if (layers.empty()) {
    o << "set label 'no defined values to plot' at graph 0.5, graph 0.5 center\n"
      << "set xrange [0:1]\nset yrange [0:1]\nplot NaN notitle\n";
    return o.str();
  }
  o << "plot ";
  for (size_t i = 0; i < layers.size(); ++i) o << (i ? ", \\\n     " : "") << layers[i];
  o << "\n";
  return o.str();
}

std::string QqPlotScript(const QqPlot& plot) {
  std::ostringstream o;
  o << kQqTerminal << kHeader << "set size ratio -1\nset key inside right bottom\n"
    << "set title " << Quote(plot.title) << " noenhanced\n"
    << "set xlabel 'expected p-value (uniform quantile)'\nset ylabel 'observed p-value'\n"
    << "set xrange [0:1]\nset yrange [0:1]\n";
  // The band uses every point; the markers at most 1000 evenly spaced ones.
  const size_t n = plot.points.size();
  const size_t step = n > 1000 ? (n + 999) / 1000 : 1;
  o << "$band << EOD\n";
  for (const metrics::QqPoint& p : plot.points) {
    o << Num(p.expected) << " " << Num(p.band_low) << " " << Num(p.band_high) << "\n";
  }
  o << "EOD\n$points << EOD\n";
  for (size_t i = 0; i < n; i += step) o << Num(plot.points[i].expected) << " " << Num(plot.points[i].observed) << "\n";
  if (n > 0 && (n - 1) % step != 0) o << Num(plot.points[n - 1].expected) << " " << Num(plot.points[n - 1].observed) << "\n";
  o << "EOD\n";
  o << "plot $band using 1:2:3 with filledcurves lc rgb '#999999' title 'pointwise 95% band', \\\n"
    << "     x with lines dt 2 lc rgb '#555555' title 'uniform', \\\n"
    << "     $points using 1:2 with points pt 7 ps 0.6 lc rgb '#0072B2' title "
    << Quote(std::to_string(n) + " tests, " + Num(std::round(plot.share_at_level * 1000) / 10) + "% at p <= " +
             Num(plot.level))
    << "\n";
  return o.str();
}

// --- Stacked bars (where edges are lost) ------------------------------------

std::string StackedBarScript(const StackedBarPlot& plot) {
  std::ostringstream o;
  o << "set terminal svg size 560,440 fixed font 'Helvetica,11' background rgb 'white'\n"
    << kHeader << "set title " << Quote(plot.title) << " noenhanced\n"
    << "set ylabel " << Quote(plot.y_label) << "\nset xlabel ' ' offset 0,-1\n"
    << "set style fill solid 0.85 border rgb '#333333'\nset grid noxtics ytics\nset key maxrows 4\n";
  double top = 0;
  double lo = 0;
  double hi = 1;
  for (size_t b = 0; b < plot.bars.size(); ++b) {
    double sum = 0;
    for (double v : plot.bars[b].parts) sum += v;
    top = std::max(top, sum);
    lo = b == 0 ? plot.bars[b].x : std::min(lo, plot.bars[b].x);
    hi = b == 0 ? plot.bars[b].x : std::max(hi, plot.bars[b].x);
  }
  o << "set xrange [" << Num(lo - 0.6) << ":" << Num(hi + 0.6) << "]\n"
    << "set yrange [0:" << Num(top > 0 ? top * 1.08 : 1) << "]\n";
  if (!plot.bars.empty()) {
    o << "set xtics scale 0 (";
    for (size_t b = 0; b < plot.bars.size(); ++b) {
      o << (b ? ", " : "") << Quote(plot.bars[b].tic) << " " << Num(plot.bars[b].x);
    }
    o << ")\n";
  }
  for (const auto& [x, text] : plot.group_labels) {
    o << "set label " << Quote(text) << " at first " << Num(x) << ", graph 0 center offset 0,-2.2 noenhanced\n";
  }
  if (top <= 0) o << "set label 'no missed solid edge and no false edge' at graph 0.5, graph 0.5 center\n";
  // One data block per category: x, bottom, top of each non-empty part.
  std::vector<double> base(plot.bars.size(), 0.0);
  std::vector<std::string> layers;
  for (size_t c = 0; c < plot.categories.size(); ++c) {
    o << "$c" << c << " << EOD\n";
    bool any = false;
    for (size_t b = 0; b < plot.bars.size(); ++b) {
      const double v = c < plot.bars[b].parts.size() ? plot.bars[b].parts[c] : 0;
      if (!(v > 0)) continue;
      o << Num(plot.bars[b].x) << " " << Num(base[b]) << " " << Num(base[b] + v) << "\n";
      base[b] += v;
      any = true;
    }
    o << "EOD\n";
    if (!any) continue;  // no legend entry for a cause that never occurs
    layers.push_back("$c" + std::to_string(c) + " using 1:3:($1-0.18):($1+0.18):2:3 with boxxyerror lc rgb " +
                     Quote(plot.categories[c].colour) + " title " + Quote(plot.categories[c].label));
  }
  if (layers.empty()) {
    o << "plot NaN notitle\n";
    return o.str();
  }
  o << "plot ";
  for (size_t i = 0; i < layers.size(); ++i) o << (i ? ", \\\n     " : "") << layers[i];
  o << "\n";
  return o.str();
}

Result<std::string> RenderGnuplot(const std::string& script) {
  Result<ProgramOutput> run = RunProgram({"gnuplot"}, script);
  if (!run.ok()) return Status::Error(run.status().message() + " (install the Debian package gnuplot-nox)");
  if (run->exit_code != 0 || run->out.find("<svg") == std::string::npos) {
    std::string message = run->err.substr(0, run->err.find('\n', run->err.find_first_not_of(" \n")));
    return Status::Error("gnuplot failed (exit " + std::to_string(run->exit_code) + "): " + message);
  }
  return run->out;
}

}  // namespace locind::app
