// PathData: observed diffusion paths sampled on a time grid.
#pragma once

#include <string>
#include <vector>

#include <Eigen/Dense>

namespace locind::sim {

struct PathData {
  std::vector<std::string> names;  // one per observed process (column)
  std::vector<double> time;        // grid, strictly increasing
  Eigen::MatrixXd values;          // time.size() x names.size(), column-major

  int processes() const { return static_cast<int>(names.size()); }
  int samples() const { return static_cast<int>(time.size()); }
};

}  // namespace locind::sim
