// parallel.hpp — a small thread pool loop and a progress bar, shared by sweeps and by the
// multi-seed turbulence runs.
//
// parallel_for(n, jobs, f) calls f(i) for i = 0..n-1 on up to `jobs` threads (the caller's
// thread included), handing out indices one at a time, so results written to slot i do not
// depend on the thread count or the order. Progress draws a bar in place on a terminal (stderr)
// and stays quiet otherwise; tick() is thread-safe.
#pragma once

#include <algorithm>
#include <atomic>
#include <chrono>
#include <cstdio>
#include <exception>
#include <mutex>
#include <string>
#include <thread>
#include <unistd.h>
#include <vector>

namespace fp {

struct Progress {
  bool enabled, tty;
  long total;
  std::atomic<long> done{0};
  std::chrono::steady_clock::time_point t0 = std::chrono::steady_clock::now();
  std::mutex m;
  const char* unit;   // what is counted ("points", "runs")
  const char* label;  // what is running ("sweep", "seeds")
  Progress(bool en, long n, const char* unit_ = "points", const char* label_ = "sweep")
      : enabled(en), tty(::isatty(2) != 0), total(n), unit(unit_), label(label_) {}
  void tick() {
    if (!enabled) {
      ++done;
      return;
    }
    std::lock_guard<std::mutex> lk(m);
    const long d = std::min(++done, total);  // an estimated total is never overrun on screen
    const double el = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    const double rate = el > 0 ? d / el : 0.0;
    const double left = rate > 0 ? (total - d) / rate : 0.0;
    if (tty) {
      const int w = 30, f = total > 0 ? static_cast<int>(w * d / total) : w;
      std::fprintf(stderr, "\r[%s%s] %ld/%ld %s  %.1f/s  %.1f s left ", std::string(f, '#').c_str(),
                   std::string(w - f, '.').c_str(), d, total, unit, rate, left);
      if (d == total) std::fprintf(stderr, "\n");
    }
    // not a terminal (a log, a pipe, a batch job): quiet, so that logs hold only results
  }
};

template <class F>
void parallel_for(long n, int jobs, F&& f) {
  std::atomic<long> next{0};
  auto worker = [&] {
    for (long i = next++; i < n; i = next++) f(i);
  };
  std::vector<std::thread> pool;
  for (int k = 1; k < std::min<long>(jobs, n); ++k) pool.emplace_back(worker);
  worker();
  for (auto& t : pool) t.join();
}

// parallel_for, but an exception thrown by f in any thread stops the hand-out of further
// indices and the first one is rethrown in the caller's thread once all threads have joined.
template <class F>
void parallel_for_rethrow(long n, int jobs, F&& f) {
  std::exception_ptr first;
  std::mutex m;
  std::atomic<bool> failed{false};
  parallel_for(n, jobs, [&](long i) {
    if (failed) return;
    try {
      f(i);
    } catch (...) {
      std::lock_guard<std::mutex> lk(m);
      if (!first) first = std::current_exception();
      failed = true;
    }
  });
  if (first) std::rethrow_exception(first);
}

}  // namespace fp
