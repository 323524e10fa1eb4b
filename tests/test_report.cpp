// test_report.cpp — the reviewer's report: SHA-256 against published digests and an independent
// implementation, the SVG module's ticks and series styles, and `floatpitch report` on the
// aft-CG demo: written whole or not at all, self-contained, the same for the same inputs, and
// saying what the other commands and the hand formula say.
#include <doctest/doctest.h>

#include <array>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <regex>
#include <set>
#include <sstream>
#include <string>

#include <nlohmann/json.hpp>

#include "model/units.hpp"
#include "report/report.hpp"
#include "util/sha256.hpp"
#include "report/svg.hpp"

#include "shell.hpp"  // after the project's headers (see there)

namespace fs = std::filesystem;

namespace {

using fp::test::Out;
using fp::test::shell;
using fp::test::slurp;

const std::string kExe = std::string(FP_BINARY_DIR) + "/floatpitch";
const std::string kSrc = FP_SOURCE_DIR;
const std::string kAft = kSrc + "/scenarios/orvane_aft_cg.toml";

Out report(const std::string& args, const std::string& env = "") { return shell(env + " " + kExe + " report " + args); }

fs::path temp_dir(const std::string& name) {
  const fs::path d = fs::path(FP_BINARY_DIR) / "test_report" / name;
  fs::remove_all(d);
  fs::create_directories(d);
  return d;
}

// GNU coreutils' sha256sum of a file: an implementation independent of ours.
std::string coreutils_sha256(const fs::path& p) {
  const Out r = shell("sha256sum '" + p.string() + "'");
  if (r.status != 0 || r.text.size() < 64) return "";
  return r.text.substr(0, 64);
}

std::size_t count(const std::string& hay, const std::string& needle) {
  std::size_t n = 0;
  for (auto at = hay.find(needle); at != std::string::npos; at = hay.find(needle, at + 1)) ++n;
  return n;
}

// The page without its date line (the one line that may differ between two runs).
std::string without_date_line(const std::string& html) {
  std::istringstream in(html);
  std::string out, line;
  while (std::getline(in, line))
    if (line.find(fp::kReportDateMarker) == std::string::npos) out += line + "\n";
  return out;
}

// ITU-R BT.601 luma of a "#rrggbb" colour, 0..255: how a grey-scale print renders it.
double luma(const std::string& hex) {
  const auto v = std::stoul(hex.substr(1), nullptr, 16);
  return 0.299 * ((v >> 16) & 255) + 0.587 * ((v >> 8) & 255) + 0.114 * (v & 255);
}

}  // namespace

TEST_CASE("SHA-256: the published examples and an independent implementation") {
  // FIPS PUB 180-2 (2002), appendix B: B.1 one-block message, B.2 multi-block message, B.3 one
  // million repetitions of 'a'.
  CHECK(fp::sha256_hex("abc") == "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  CHECK(fp::sha256_hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq") ==
        "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
  CHECK(fp::sha256_hex(std::string(1000000, 'a')) ==
        "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
  // Lengths around the padding boundaries (55, 56, 63, 64, 65 bytes) and the empty message,
  // against GNU coreutils' sha256sum.
  const fs::path d = temp_dir("sha");
  for (std::size_t n : {0, 1, 55, 56, 63, 64, 65, 119, 1000}) {
    std::string msg(n, 'A');
    for (std::size_t i = 0; i < n; ++i) msg[i] = static_cast<char>('A' + (i * 7) % 26);
    const fs::path f = d / fs::path(std::to_string(n)).replace_extension(".bin");
    std::ofstream(f, std::ios::binary) << msg;
    const std::string ref = coreutils_sha256(f);
    if (ref.empty()) {
      MESSAGE("sha256sum (GNU coreutils) not available: the cross-check is skipped");
      break;
    }
    CAPTURE(n);
    CHECK(fp::sha256_hex(msg) == ref);
  }
}

TEST_CASE("SVG: ticks at 1, 2 and 5 times a power of ten that cover the range") {
  // The 1-2-5 series of "nice" label steps (Heckbert, "Nice numbers for graph labels",
  // Graphics Gems, 1990).
  const std::pair<double, double> ranges[] = {{0, 1}, {-3.7, 12.2}, {0.13, 0.45}, {1e-4, 3e-4}, {-45, 0.5}, {54, 151}};
  for (const auto& [lo, hi] : ranges) {
    CAPTURE(lo);
    CAPTURE(hi);
    const fp::svg::Ticks t = fp::svg::nice_ticks(lo, hi, 6);
    REQUIRE(t.values.size() >= 3);
    CHECK(t.values.size() <= 13);
    const double m = t.step / std::pow(10.0, std::floor(std::log10(t.step) + 1e-9));
    CHECK((std::abs(m - 1) < 1e-9 || std::abs(m - 2) < 1e-9 || std::abs(m - 5) < 1e-9));
    CHECK(t.values.front() >= lo - 1e-12);
    CHECK(t.values.front() - t.step < lo);
    CHECK(t.values.back() <= hi + 1e-12);
    CHECK(t.values.back() + t.step > hi);
    for (std::size_t i = 0; i < t.values.size(); ++i) {
      // every tick is a whole multiple of the step, and prints exactly with t.decimals
      CHECK(std::abs(t.values[i] / t.step - std::round(t.values[i] / t.step)) < 1e-6);
      CHECK(std::abs(std::stod(std::regex_replace(fp::svg::number(t.values[i], t.decimals), std::regex("\u2212"), "-")) -
                     t.values[i]) < 1e-9 * std::max(1.0, std::abs(t.values[i])));
    }
  }
  // The minus sign is U+2212 (Unicode "MINUS SIGN"), and a negative zero prints without one.
  CHECK(fp::svg::number(-2.5, 1) == "\u22122.5");
  CHECK(fp::svg::number(-0.0004, 2) == "0.00");
}

TEST_CASE("SVG: series stay distinct in grey, gaps break the line, labels are escaped, nothing is fetched") {
  fp::svg::Plot p;
  p.id = "t";
  p.title = "a < b & c";
  p.x = {"time", "s"};
  p.y = {"alpha", "deg"};
  p.series.push_back({"held", {0, 1, 2, 3, 4}, {0, 1, NAN, 1, 0}, fp::svg::Style::first});
  p.series.push_back({"free", {0, 1, 2, 3, 4}, {0, 2, 3, 2, 0}, fp::svg::Style::second});
  const std::string s = fp::svg::render(p);
  CHECK(s.find("a &lt; b &amp; c") != std::string::npos);
  CHECK(s.find("http") == std::string::npos);
  CHECK(s.find("href") == std::string::npos);
  CHECK(s.find("<script") == std::string::npos);
  // the two data paths: the held one has two pieces (the NaN), the free one one piece
  const std::regex path_re("<path d=\"(M[^\"]*)\" stroke=\"(#[0-9a-f]{6})\" stroke-width=\"([0-9.]+)\" fill=\"none\"( stroke-dasharray=\"([^\"]+)\")? stroke-linejoin");
  std::map<std::string, std::pair<std::string, std::string>> by_colour;  // colour -> (d, dash)
  for (auto it = std::sregex_iterator(s.begin(), s.end(), path_re); it != std::sregex_iterator(); ++it)
    by_colour[(*it)[2]] = {(*it)[1], (*it)[5]};
  REQUIRE(by_colour.size() == 2);
  auto it = by_colour.begin();
  const auto& [c1, v1] = *it++;
  const auto& [c2, v2] = *it;
  const bool first_is_c1 = count(v1.first, "M") == 2;
  const std::string& held_colour = first_is_c1 ? c1 : c2;
  const std::string& free_colour = first_is_c1 ? c2 : c1;
  CHECK(count((first_is_c1 ? v1 : v2).first, "M") == 2);
  CHECK(count((first_is_c1 ? v2 : v1).first, "M") == 1);
  // In grey (ITU-R BT.601 luma) the held line is dark and the free one much lighter, and only
  // one of them is dashed: distinct in grey even without the dashes.
  CHECK(luma(held_colour) < 80);
  CHECK(luma(free_colour) - luma(held_colour) > 60);
  CHECK((first_is_c1 ? v1 : v2).second.empty());
  CHECK_FALSE((first_is_c1 ? v2 : v1).second.empty());
}

TEST_CASE("floatpitch report on the aft-CG demo") {
  const fs::path d = temp_dir("aft");
  const fs::path out = d / "rep";
  const Out r = report(kAft + " --out " + out.string() + " --jobs 2");
  CAPTURE(r.text);
  REQUIRE(r.status == 0);
  const std::string html = slurp(out / "report.html");
  REQUIRE_FALSE(html.empty());

  SUBCASE("the page and the data files it was drawn from") {
    for (const char* f : {"scenario_resolved.toml", "inputs.json", "trim.json", "margins.json", "stick_force_speed.csv",
                          "stick_force_per_g.csv", "modes.json", "roots.csv", "cg_sweep.csv", "cg_sweep.json",
                          "gust_g1_held.csv", "gust_g1_free.csv", "gust_g1_summary.json", "uncertainty_samples.csv",
                          "uncertainty_samples.json", "uncertainty_corners.csv", "uncertainty_responses.csv",
                          "uncertainty_alpha.csv", "findings.json"}) {
      CAPTURE(f);
      CHECK(fs::file_size(out / "data" / f) > 0);
      CHECK(html.find(std::string("data/") + f) != std::string::npos);  // listed on the page
    }
    // nothing outside the page: no script, no style sheet, no image, no font, no URL
    for (const char* bad : {"http:", "https:", "<script", "<link", "<img", "<iframe", "@import", "@font-face", " src="}) {
      CAPTURE(bad);
      CHECK(html.find(bad) == std::string::npos);
    }
  }

  SUBCASE("the cautions, on the first page and at the end") {
    const std::string caution = "Engineering analysis aid, not approved data.";
    CHECK(count(html, caution) == 2);
    const auto first = html.find(caution), last = html.rfind(caution);
    CHECK(first < html.find("At a glance"));
    CHECK(last > html.find("8. Findings"));
    CHECK(html.find("No flutter and no structural flexibility are modelled") != std::string::npos);
    CHECK(html.find("qualified, authorized people") != std::string::npos);
    // findings are worded as comparisons, never as compliance findings
    const auto findings = nlohmann::json::parse(slurp(out / "data/findings.json"));
    REQUIRE(findings["findings"].size() >= 5);
    for (const auto& f : findings["findings"]) {
      const std::string all = f.dump();
      CAPTURE(all);
      for (const char* word : {"complies", "compliant", "fails", "passes", "meets the requirement", "is acceptable"})
        CHECK(all.find(word) == std::string::npos);
      CHECK_FALSE(f["source"].get<std::string>().empty());
      CHECK_FALSE(f["criterion"].get<std::string>().empty());
    }
  }

  SUBCASE("the first page says held is stable and free diverges, as the other commands do") {
    const auto summary = html.substr(0, html.find("id=\"s1\""));
    CHECK(summary.find("stable with the stick held") != std::string::npos);
    CHECK(summary.find("diverges with the stick free") != std::string::npos);
    // the margins and roots on the page are those of `floatpitch margins` and `modes`
    const Out m = shell(kExe + " margins " + kAft + " --json");
    const Out mo = shell(kExe + " modes " + kAft + " --json");
    REQUIRE(m.status == 0);
    REQUIRE(mo.status == 0);
    auto mj = nlohmann::json::parse(m.text);
    auto oj = nlohmann::json::parse(mo.text);
    oj.erase("scenario");
    auto rj = nlohmann::json::parse(slurp(out / "data/margins.json"));
    mj.erase("scenario");
    CHECK(rj == mj);
    CHECK(nlohmann::json::parse(slurp(out / "data/modes.json")) == oj);
    const double sm_free = mj["static_margin_free"].get<double>();
    const double sm_fixed = mj["static_margin_fixed"].get<double>();
    CHECK(sm_fixed > 0);
    CHECK(sm_free < 0);
    CHECK(summary.find(">" + fp::svg::number(100 * sm_free, 1) + "<") != std::string::npos);
    CHECK(summary.find(">+" + fp::svg::number(100 * sm_fixed, 1) + "<") != std::string::npos);
    double held_max = -1e9, free_max = -1e9, t_double = 0;
    for (const auto& x : oj["held"]) held_max = std::max(held_max, x["real"].get<double>());
    for (const auto& x : oj["free"])
      if (x["real"].get<double>() > free_max) {
        free_max = x["real"].get<double>();
        t_double = x.value("time_to_double_s", 0.0);
      }
    CHECK(held_max < 0);
    CHECK(free_max > 0);
    CHECK(summary.find("doubles in " + fp::svg::number(t_double, 1) + " s") != std::string::npos);
    // Why: the free-elevator factor F = 1 - tau Ch_alpha / Ch_delta (Etkin and Reid, Dynamics of
    // Flight, sec. 2.6), by hand from the demo airplane's file: tau 0.50, Ch_alpha -0.0030 /deg,
    // Ch_delta -0.0065 /deg.
    const double F = 1.0 - 0.50 * (-0.0030) / (-0.0065);
    CHECK(summary.find("= " + fp::svg::number(F, 3) + " in the closed form") != std::string::npos);
    // and the gust run: the held airplane stays, the free one departs (summary.json of `run`)
    const auto g = nlohmann::json::parse(slurp(out / "data/gust_g1_summary.json"));
    CHECK(g["held"]["diverged"] == false);
    CHECK(g["free"]["diverged"] == true);
    CHECK(summary.find("departs at " + fp::svg::number(g["free"]["divergence_time_s"].get<double>(), 1) + " s") !=
          std::string::npos);
  }

  SUBCASE("the input files are named with their SHA-256 (checked with GNU coreutils)") {
    const auto in = nlohmann::json::parse(slurp(out / "data/inputs.json"));
    REQUIRE(in["files"].size() == 2);  // the case file and the airplane it includes
    for (const auto& f : in["files"]) {
      const std::string p = f["path"].get<std::string>();
      const std::string ref = coreutils_sha256(p);
      CAPTURE(p);
      if (!ref.empty()) CHECK(f["sha256"].get<std::string>() == ref);
      CHECK(html.find(f["sha256"].get<std::string>()) != std::string::npos);
    }
    CHECK(in["command"].get<std::string>() == "floatpitch report " + kAft + " --out " + out.string());
  }

  SUBCASE("same inputs, same report, but for the date line") {
    const fs::path first = d / "first";
    fs::rename(out, first);
    const Out r2 = report(kAft + " --out " + out.string() + " --jobs 1", "SOURCE_DATE_EPOCH=86400");
    REQUIRE(r2.status == 0);
    std::set<std::string> a, b;
    for (const auto& e : fs::recursive_directory_iterator(first)) a.insert(fs::relative(e.path(), first).string());
    for (const auto& e : fs::recursive_directory_iterator(out)) b.insert(fs::relative(e.path(), out).string());
    CHECK(a == b);
    for (const auto& f : a) {
      if (fs::is_directory(first / f)) continue;
      CAPTURE(f);
      if (f == "report.html") {
        const std::string h1 = slurp(first / f), h2 = slurp(out / f);
        CHECK(count(h1, fp::kReportDateMarker) == 1);
        CHECK(h2.find("Generated 1970-01-02 (UTC)") != std::string::npos);  // the date line is the date
        CHECK(without_date_line(h1) == without_date_line(h2));
      } else {
        CHECK(slurp(first / f) == slurp(out / f));  // also with another number of threads
      }
    }
  }
}

TEST_CASE("floatpitch report: bad input is refused with a clear message, nothing written") {
  const fs::path d = temp_dir("bad");
  struct Bad {
    const char* name;
    std::string args;
    const char* expect1;
    const char* expect2;
  };
  const Bad cases[] = {
      {"CG range backwards", "--cg-range 0.40:0.30", "--cg-range", "TO must be aft"},
      {"CG range not numbers", "--cg-range aft:fwd", "--cg-range", "FROM:TO"},
      {"CG range outside the key's range", "--cg-range 0.1:2.5", "--cg-range", "1.5"},
      {"unknown gust shape", "--gusts 'wobble:1 m:2 m/s'", "--gusts", "1-cos"},
      {"unknown unit in a gust", "--gusts '1-cos:25 parsecs:3 m/s'", "parsecs", "m"},
      {"gust amplitude out of range", "--gusts '1-cos:25 m:90 m/s'", "--gusts", "amplitude"},
      {"bad sample band", "--sample 'elevator.ch_alpha=uniform(0.1,-0.1)'", "--sample", "HI"},
      {"unknown sampled key", "--sample 'elevator.ch_alfa=uniform(-0.2,-0.1)'", "ch_alfa", "ch_alpha"},
      {"hinge band too wide", "--hinge-band 150", "--hinge-band", "99"},
      {"bad --set", "--set mass.cg=abc", "mass.cg", "--set"},
  };
  for (const auto& b : cases) {
    CAPTURE(b.name);
    const fs::path out = d / "out";
    const Out r = report(kAft + " " + b.args + " --out " + out.string());
    CAPTURE(r.text);
    CHECK(r.status == 2);
    CHECK(r.text.find(b.expect1) != std::string::npos);
    CHECK(r.text.find(b.expect2) != std::string::npos);
    CHECK_FALSE(fs::exists(out));
  }
  SUBCASE("an irreversible circuit: the elevator cannot float, nothing stick-free to report") {
    const fs::path f = d / "irreversible.toml";
    std::ofstream(f) << "include = \"" << kSrc << "/scenarios/orvane_aft_cg.toml\"\n[circuit]\nreversible = false\n";
    const fs::path out = d / "out2";
    const Out r = report(f.string() + " --out " + out.string());
    CAPTURE(r.text);
    CHECK(r.status == 2);
    CHECK(r.text.find("irreversible") != std::string::npos);
    CHECK_FALSE(fs::exists(out));
  }
}

TEST_CASE("floatpitch report: chosen gusts, and --pdf without Chromium") {
  const fs::path d = temp_dir("gusts");
  const fs::path out = d / "rep";
  const Out r = report(kAft + " --out " + out.string() + " --gusts scenario --gusts '1-cos:30 m:2 m/s@2' --samples 8",
                       "FLOATPITCH_CHROMIUM=/nonexistent/chromium");
  CAPTURE(r.text);
  REQUIRE(r.status == 0);
  for (const char* f : {"gust_g1_held.csv", "gust_g1_free.csv", "gust_g2_held.csv", "gust_g2_free.csv"})
    CHECK(fs::exists(out / "data" / f));
  const std::string html = slurp(out / "report.html");
  CHECK(html.find("g2: 1-cosine vertical gust, 2.00 m/s") != std::string::npos);
  // the second gust reaches the CG at 2 s: its start distance is the trim airspeed times 2 s
  const auto g2 = nlohmann::json::parse(slurp(out / "data/gust_g2_summary.json"));
  CHECK(g2["gust_case"]["choice"] == "1-cos:30 m:2 m/s@2");
  const std::string held = slurp(out / "data/gust_g2_held.csv");
  // the vertical gust at the wing is zero until the gust arrives: at the first output step at or
  // after 2 s (the wing a.c., 0.17 m ahead of the CG, meets it 3 ms before the CG does)
  std::istringstream in(held);
  std::string line;
  std::getline(in, line);
  double first_gust_time = -1;
  while (std::getline(in, line)) {
    std::vector<double> v;
    std::stringstream ls(line);
    for (std::string c; std::getline(ls, c, ',');) v.push_back(std::stod(c));
    if (v.size() > 13 && std::abs(v[13]) > 1e-9) {
      first_gust_time = v[0];
      break;
    }
  }
  CHECK(first_gust_time > 1.98);
  CHECK(first_gust_time < 2.0 + 1e-6);
  // the uncertainty section used 8 samples, as asked
  CHECK(nlohmann::json::parse(slurp(out / "data/uncertainty_samples.json"))["points"].size() == 8);
  // --pdf where Chromium is missing: the page is written, the message says why there is no PDF
  const fs::path out2 = d / "rep2";
  const Out p = report(kAft + " --out " + out2.string() + " --samples 4 --pdf", "FLOATPITCH_CHROMIUM=/nonexistent/chromium");
  CAPTURE(p.text);
  CHECK(p.status == 0);
  CHECK(p.text.find("no PDF written") != std::string::npos);
  CHECK(fs::exists(out2 / "report.html"));
  CHECK_FALSE(fs::exists(out2 / "report.pdf"));
}
