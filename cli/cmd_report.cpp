// cmd_report.cpp — `floatpitch report` (see commands.hpp).
#include "cli/common.hpp"

#include <iostream>
#include <string>

#include "output/atomic_file.hpp"
#include "report/report.hpp"

namespace fp::cmd {

int report(const ReportOpts& o) {
  return guarded(o.common.scenario, [&] {
    ReportOptions r;
    r.scenario = o.common.scenario;
    r.set = o.common.set;
    r.out = o.out;
    r.cg_range = o.cg_range;
    r.gusts = o.gusts;
    r.hinge_band = o.hinge_band / 100.0;
    r.sample = o.sample;
    r.samples = o.samples;
    r.seed = o.seed;
    r.min_margin = o.min_margin;
    r.min_force_per_g = o.min_force_per_g;
    r.pdf = o.pdf;
    r.basis = o.basis;
    r.jobs = default_jobs(o.jobs);
    const ReportData d = make_report(r);
    OutputSet out(o.out);
    const auto files = report_files(d);
    for (const auto& [name, content] : files) out.add(name, content);
    out.commit();
    std::cout << "wrote " << o.out << "/report.html and " << files.size() - 1 << " data files in " << o.out << "/data/\n";
    if (o.pdf) {
      const std::string chromium = find_chromium();
      if (chromium.empty()) {
        std::cout << "--pdf: no PDF written: headless Chromium is not installed (looked for chromium and "
                     "chromium-browser on the PATH, and $FLOATPITCH_CHROMIUM). Open report.html in a browser and "
                     "print it, or install Chromium (Debian: apt-get install chromium).\n";
      } else {
        const std::string err = print_pdf(chromium, o.out + "/report.html", o.out + "/report.pdf");
        if (!err.empty()) {
          std::cerr << "error: --pdf: " << err << "; report.html and data/ are written, report.pdf is not\n";
          return kBadInput;
        }
        std::cout << "wrote " << o.out << "/report.pdf\n";
      }
    }
    return kOk;
  });
}

}  // namespace fp::cmd
