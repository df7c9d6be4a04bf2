#include "app/io/svg_render.h"

#include <graphviz/cgraph.h>
#include <graphviz/gvc.h>

#include <mutex>

namespace locind::app {

// One Graphviz context for the whole process, used under a lock: with
// Graphviz 2.42 a fresh context per drawing makes the pango text-layout
// plugin compare against a font name freed with the previous context (a
// heap-use-after-free that AddressSanitizer reports from the second drawing
// on). The context lives until exit on purpose.
Result<std::string> RenderSvg(const std::string& dot) {
  static std::mutex mutex;
  std::lock_guard<std::mutex> lock(mutex);
  static GVC_t* const gvc = gvContext();
  Agraph_t* g = agmemread(dot.c_str());
  if (g == nullptr) return Status::Error("Graphviz could not read the DOT text");
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
  if (svg.empty()) return Status::Error("Graphviz could not lay out the graph");
  return svg;
}

}  // namespace locind::app
