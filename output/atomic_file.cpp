// atomic_file.cpp — temporary file then rename (see atomic_file.hpp).
#include "output/atomic_file.hpp"

#include <filesystem>
#include <fstream>
#include <stdexcept>
#include <unistd.h>

namespace fp {

namespace fs = std::filesystem;

namespace {
std::string temp_name(const fs::path& target) {
  std::string name = ".";  // appended piece by piece: gcc 12's -Wrestrict misreads a chain of +
  name += target.filename().string();
  name += ".tmp";
  name += std::to_string(::getpid());
  return (target.parent_path() / name).string();
}

void write_temp(const std::string& tmp, const std::string& content) {
  std::ofstream f(tmp, std::ios::binary | std::ios::trunc);
  if (!f) throw std::runtime_error("cannot write " + tmp);
  f.write(content.data(), static_cast<std::streamsize>(content.size()));
  f.close();
  if (!f) throw std::runtime_error("cannot write " + tmp + " (disk full?)");
}
}  // namespace

void write_file_atomic(const std::string& path, const std::string& content) {
  const fs::path target(path);
  if (target.has_parent_path()) fs::create_directories(target.parent_path());
  const std::string tmp = temp_name(target);
  try {
    write_temp(tmp, content);
    fs::rename(tmp, target);
  } catch (...) {
    std::error_code ec;
    fs::remove(tmp, ec);
    throw;
  }
}

void OutputSet::commit() const {
  std::error_code ec;
  fs::create_directories(dir_, ec);
  if (ec) throw std::runtime_error("cannot create directory " + dir_ + ": " + ec.message());
  std::vector<std::pair<std::string, std::string>> staged;
  try {
    for (const auto& [name, content] : files_) {
      const fs::path target = fs::path(dir_) / name;
      if (target.has_parent_path()) fs::create_directories(target.parent_path());
      const std::string tmp = temp_name(target);
      staged.emplace_back(tmp, target.string());
      write_temp(tmp, content);
    }
  } catch (...) {
    for (const auto& s : staged) fs::remove(s.first, ec);
    throw;
  }
  for (const auto& s : staged) fs::rename(s.first, s.second);
}

}  // namespace fp
