# locind_report: the HTML report: figures, drawings, page.
locind_layer(locind_report
  DEPS locind_running
  SOURCES
    app/report/report.cc
    app/report/report_drawings.cc
    app/report/report_figures.cc
    app/report/report_html.cc
    app/report/lost_edges_figure.cc
)
