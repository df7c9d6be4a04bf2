#include "app/svg_render.h"

#include <graphviz/cgraph.h>
#include <graphviz/gvc.h>

#include <mutex>

namespace locind::app {

Result<std::string> RenderSvg(const std::string& dot) {
  // The Graphviz library keeps global state; render one graph at a time.
  static std::mutex mutex;
  std::lock_guard<std::mutex> lock(mutex);
  GVC_t* gvc = gvContext();
  Agraph_t* g = agmemread(dot.c_str());
  if (g == nullptr) {
    gvFreeContext(gvc);
    return Status::Error("Graphviz could not read the DOT text");
  }
  std::string svg;
  if (gvLayout(gvc, g, "dot") == 0) {
    char* data = nullptr;
    unsigned int length = 0;
    if (gvRenderData(gvc, g, "svg", &data, &length) == 0 && data != nullptr) {
      svg.assign(data, length);
    }
    gvFreeRenderData(data);
    gvFreeLayout(gvc, g);
  }
  agclose(g);
  gvFreeContext(gvc);
  if (svg.empty()) return Status::Error("Graphviz could not lay out the graph");
  return svg;
}

}  // namespace locind::app
