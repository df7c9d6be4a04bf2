#include "graph/dmg.h"

#include <bit>
#include <cassert>

namespace locind::graph {

Dmg::Dmg(std::vector<std::string> names)
    : names_(std::move(names)),
      words_((static_cast<int>(names_.size()) + 63) / 64),
      directed_in_(names_.size() * words_, 0),
      bidirected_(names_.size() * words_, 0) {}

std::optional<int> Dmg::index(std::string_view name) const {
  for (int v = 0; v < size(); ++v) {
    if (names_[v] == name) return v;
  }
  return std::nullopt;
}

bool Dmg::Bit(const std::vector<uint64_t>& rows, int row, int col) const {
  assert(row >= 0 && row < size() && col >= 0 && col < size());
  return (rows[row * words_ + col / 64] >> (col % 64)) & 1u;
}

void Dmg::Set(std::vector<uint64_t>& rows, int row, int col, bool on) {
  assert(row >= 0 && row < size() && col >= 0 && col < size());
  uint64_t& word = rows[row * words_ + col / 64];
  const uint64_t bit = uint64_t{1} << (col % 64);
  word = on ? (word | bit) : (word & ~bit);
}

std::vector<int> Dmg::Row(const std::vector<uint64_t>& rows, int row) const {
  std::vector<int> out;
  for (int w = 0; w < words_; ++w) {
    for (uint64_t bits = rows[row * words_ + w]; bits != 0; bits &= bits - 1) {
      out.push_back(w * 64 + std::countr_zero(bits));
    }
  }
  return out;
}

void Dmg::AddDirected(int from, int to) { Set(directed_in_, to, from, true); }
void Dmg::RemoveDirected(int from, int to) { Set(directed_in_, to, from, false); }

void Dmg::AddBidirected(int a, int b) {
  assert(a != b);
  Set(bidirected_, a, b, true);
  Set(bidirected_, b, a, true);
}

void Dmg::RemoveBidirected(int a, int b) {
  Set(bidirected_, a, b, false);
  Set(bidirected_, b, a, false);
}

std::vector<int> Dmg::Children(int v) const {
  std::vector<int> out;
  for (int w = 0; w < size(); ++w) {
    if (HasDirected(v, w)) out.push_back(w);
  }
  return out;
}

int Dmg::DirectedEdgeCount() const {
  int count = 0;
  for (uint64_t word : directed_in_) count += std::popcount(word);
  return count;
}

int Dmg::BidirectedEdgeCount() const {
  int count = 0;
  for (uint64_t word : bidirected_) count += std::popcount(word);
  return count / 2;
}

Dmg Dmg::Induced(const std::vector<int>& keep) const {
  std::vector<std::string> names;
  for (int v : keep) names.push_back(names_[v]);
  Dmg out(std::move(names));
  for (size_t i = 0; i < keep.size(); ++i) {
    for (size_t j = 0; j < keep.size(); ++j) {
      if (HasDirected(keep[i], keep[j])) out.AddDirected(i, j);
      if (i != j && HasBidirected(keep[i], keep[j])) out.AddBidirected(i, j);
    }
  }
  return out;
}

bool Dmg::operator==(const Dmg& other) const {
  return names_ == other.names_ && directed_in_ == other.directed_in_ &&
         bidirected_ == other.bidirected_;
}

}  // namespace locind::graph
