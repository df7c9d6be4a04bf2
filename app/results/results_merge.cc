#include "app/results/results_merge.h"

#include <charconv>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <tuple>

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

// Appends the rows of DIR/FILE (after its header) to the lines of their units.
Status ReadUnitLines(const std::string& dir, const std::string& file, const std::string& header,
                     std::map<Unit, UnitResult>& units,
                     std::vector<std::string> UnitResult::*member) {
  const std::string path = dir + "/" + file;
  Result<std::string> text = ReadText(path);
  if (!text.ok()) return text.status();
  const std::vector<std::string> lines = Lines(*text);
  if (lines.empty() || lines[0] != header) {
    return Status::Error(path + ":1:1: header: not the columns of this version of locind");
  }
  for (size_t i = 1; i < lines.size(); ++i) {
    const std::optional<Unit> u = UnitOfLine(lines[i]);
    if (!u || !units.count(*u)) {
      return Status::Error(path + ":" + std::to_string(i + 1) + ":1: row: no matching replicate");
    }
    (units[*u].*member).push_back(lines[i]);
  }
  return Status::Ok();
}

}  // namespace

Result<SavedStudy> ReadSavedStudy(const std::string& dir) {
  std::vector<std::string> inputs;
  std::error_code ec;
  for (const auto& entry : std::filesystem::directory_iterator(dir + "/input", ec)) {
    inputs.push_back(entry.path().string());
  }
  if (ec || inputs.size() != 1) {
    return Status::Error(dir + "/input: expected exactly one study file (written by locind run)");
  }
  Result<std::string> text = ReadText(inputs[0]);
  if (!text.ok()) return text.status();
  return SavedStudy{inputs[0], *text};
}

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
  Result<SavedStudy> saved = ReadSavedStudy(dir);
  if (!saved.ok()) return saved.status();
  p.study_path = saved->path;
  p.study_text = saved->text;

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
  for (const auto& [file, header, member] :
       {std::tuple{"edges.csv", &EdgeHeader(), &UnitResult::edge_lines},
        std::tuple{"null_tests.csv", &NullTestHeader(), &UnitResult::null_test_lines}}) {
    Status s = ReadUnitLines(dir, file, *header, p.units, member);
    if (!s.ok()) return s;
  }
  return p;
}

}  // namespace locind::app
