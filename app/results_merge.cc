#include "app/results_merge.h"

#include <charconv>
#include <filesystem>
#include <fstream>
#include <sstream>

namespace locind::app {
namespace {

Result<std::string> ReadText(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return Status::Error(path + ": cannot open the file (is this the folder of a finished --part run?)");
  std::ostringstream text;
  text << in.rdbuf();
  return text.str();
}

std::vector<std::string> Lines(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) out.push_back(line);
  return out;
}

// (cell, replicate) from the first two fields of a CSV line.
std::optional<Unit> UnitOfLine(const std::string& line) {
  const size_t a = line.find(',');
  const size_t b = a == std::string::npos ? a : line.find(',', a + 1);
  if (b == std::string::npos) return std::nullopt;
  Unit u;
  const char* cell_end = line.data() + a;
  const char* replicate_end = line.data() + b;
  const auto cell = std::from_chars(line.data(), cell_end, u.cell);
  const auto replicate = std::from_chars(cell_end + 1, replicate_end, u.replicate);
  if (cell.ec != std::errc() || cell.ptr != cell_end || replicate.ec != std::errc() ||
      replicate.ptr != replicate_end) {
    return std::nullopt;
  }
  return u;
}

}  // namespace

Result<PartFolder> ReadPartFolder(const std::string& dir) {
  PartFolder p;
  p.dir = dir;
  Result<std::string> part = ReadText(dir + "/part.txt");
  if (!part.ok()) return part.status();
  std::string text = *part;
  while (!text.empty() && (text.back() == '\n' || text.back() == '\r')) text.pop_back();
  const std::optional<Part> parsed = ParsePart(text);
  if (!parsed) return Status::Error(dir + "/part.txt:1:1: part: expected K/N");
  p.part = *parsed;
  std::vector<std::string> inputs;
  std::error_code ec;
  for (const auto& entry : std::filesystem::directory_iterator(dir + "/input", ec)) {
    inputs.push_back(entry.path().string());
  }
  if (ec || inputs.size() != 1) {
    return Status::Error(dir + "/input: expected exactly one study file (written by locind run)");
  }
  p.study_path = inputs[0];
  Result<std::string> study = ReadText(p.study_path);
  if (!study.ok()) return study.status();
  p.study_text = *study;

  Result<std::string> replicates = ReadText(dir + "/replicates.csv");
  if (!replicates.ok()) return replicates.status();
  const std::vector<std::string> rows = Lines(*replicates);
  if (rows.empty() || rows[0] != ReplicateHeader()) {
    return Status::Error(dir + "/replicates.csv:1:1: header: not the columns of this version of locind");
  }
  for (size_t i = 1; i < rows.size(); ++i) {
    std::optional<ReplicateRow> row = ParseReplicateRow(rows[i]);
    if (!row) return Status::Error(dir + "/replicates.csv:" + std::to_string(i + 1) + ":1: row: malformed");
    const Unit u{row->cell, row->replicate};
    p.units[u].unit = u;
    p.units[u].rows.push_back(std::move(*row));
  }
  Result<std::string> edges = ReadText(dir + "/edges.csv");
  if (!edges.ok()) return edges.status();
  const std::vector<std::string> lines = Lines(*edges);
  if (lines.empty() || lines[0] != EdgeHeader()) {
    return Status::Error(dir + "/edges.csv:1:1: header: not the columns of this version of locind");
  }
  for (size_t i = 1; i < lines.size(); ++i) {
    const std::optional<Unit> u = UnitOfLine(lines[i]);
    if (!u || !p.units.count(*u)) {
      return Status::Error(dir + "/edges.csv:" + std::to_string(i + 1) + ":1: row: no matching replicate");
    }
    p.units[*u].edge_lines.push_back(lines[i]);
  }
  return p;
}

}  // namespace locind::app
