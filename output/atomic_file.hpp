// atomic_file.hpp — outputs are written whole or not at all.
//
// An OutputSet collects the files of one command in memory; commit() creates the directory,
// writes each file to a temporary name beside its target and renames it into place only when
// all were written. A command that fails before commit() leaves nothing behind.
#pragma once

#include <string>
#include <utility>
#include <vector>

namespace fp {

class OutputSet {
 public:
  explicit OutputSet(std::string dir) : dir_(std::move(dir)) {}
  void add(const std::string& name, std::string content) { files_.emplace_back(name, std::move(content)); }
  // Throws std::runtime_error naming the file on an I/O failure (after removing its temporaries).
  void commit() const;
  const std::string& dir() const { return dir_; }

 private:
  std::string dir_;
  std::vector<std::pair<std::string, std::string>> files_;
};

// Write one file atomically (temporary file, then rename). Throws std::runtime_error.
void write_file_atomic(const std::string& path, const std::string& content);

}  // namespace fp
