#include "app/io/atomic_file.h"

#include <cstdio>
#include <fstream>

#include <unistd.h>

namespace locind::app {

Status WriteFileAtomically(const std::string& path, const std::string& content) {
  const std::string temp = path + ".partial." + std::to_string(::getpid());
  {
    std::ofstream out(temp, std::ios::binary | std::ios::trunc);
    if (!out) return Status::Error(path + ": cannot write the file");
    out << content;
    out.flush();
    if (!out) {
      std::remove(temp.c_str());
      return Status::Error(path + ": write failed");
    }
  }
  if (std::rename(temp.c_str(), path.c_str()) != 0) {
    std::remove(temp.c_str());
    return Status::Error(path + ": cannot rename the finished file into place");
  }
  return Status::Ok();
}

}  // namespace locind::app
