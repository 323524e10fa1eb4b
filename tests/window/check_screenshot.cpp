// check_screenshot.cpp — reads a screenshot of floatpitch-view back and checks it:
//   * the PNG has the window's size and is not blank (many colours, much drawn);
//   * the status line with the cautions is there (a dark band across the bottom);
//   * in the chosen time plot, the held line (its colour) lies where the held run's CSV says it
//     must, and the free line likewise, column by column, and the two lines are apart over a
//     good stretch of the plot after the gust.
// The layout file (floatpitch-view --layout) gives the plot area, its ranges and the colours.
//
//   window_check_screenshot SHOT.png LAYOUT held.csv free.csv PLOT "COLUMN [unit]"
// (PLOT is the plot's name in the layout file, e.g. theta; COLUMN the CSV header cell.)
// Exit status 0 when every check passes; otherwise each failed check is printed, status 1.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <fstream>
#include <iostream>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include <SFML/Graphics/Image.hpp>

namespace {

int failures = 0;
void check(bool ok, const std::string& what) {
  std::cout << (ok ? "  ok    " : "  FAIL  ") << what << "\n";
  if (!ok) ++failures;
}

struct Plot {
  double p0x = 0, p0y = 0, p1x = 0, p1y = 0, x0 = 0, x1 = 1, y0 = 0, y1 = 1;
  double l0x = 0, l0y = 0, l1x = 0, l1y = 0;
  bool found = false;
};

struct Csv {
  std::vector<double> t, v;
  double at(double time) const {
    if (t.empty() || time < t.front() || time > t.back()) return NAN;
    const auto k = static_cast<std::size_t>(std::lower_bound(t.begin(), t.end(), time) - t.begin());
    if (k == 0) return v[0];
    const double w = (time - t[k - 1]) / (t[k] - t[k - 1]);
    return v[k - 1] + w * (v[k] - v[k - 1]);
  }
};

Csv read_csv(const std::string& path, const std::string& column) {
  Csv c;
  std::ifstream in(path);
  std::string line;
  if (!std::getline(in, line)) return c;
  std::vector<std::string> head;
  std::stringstream hs(line);
  for (std::string cell; std::getline(hs, cell, ',');) head.push_back(cell);
  const auto ti = std::find(head.begin(), head.end(), "time [s]") - head.begin();
  const auto vi = std::find(head.begin(), head.end(), column) - head.begin();
  if (ti == static_cast<long>(head.size()) || vi == static_cast<long>(head.size())) return c;
  while (std::getline(in, line)) {
    std::vector<double> cells;
    std::stringstream ls(line);
    for (std::string cell; std::getline(ls, cell, ',');) cells.push_back(std::stod(cell));
    c.t.push_back(cells.at(static_cast<std::size_t>(ti)));
    c.v.push_back(cells.at(static_cast<std::size_t>(vi)));
  }
  return c;
}

double distance(sf::Color a, const int rgb[3]) {
  const double dr = a.r - rgb[0], dg = a.g - rgb[1], db = a.b - rgb[2];
  return std::sqrt(dr * dr + dg * dg + db * db);
}

// Is there a pixel of colour `rgb` within `tol` rows of row y in column x (inside the plot)?
bool near(const sf::Image& img, const Plot& p, int x, double y, const int rgb[3], int tol) {
  for (int dy = -tol; dy <= tol; ++dy) {
    const int yy = static_cast<int>(std::lround(y)) + dy;
    if (yy <= p.p0y || yy >= p.p1y) continue;
    if (distance(img.getPixel(static_cast<unsigned>(x), static_cast<unsigned>(yy)), rgb) < 70.0) return true;
  }
  return false;
}

}  // namespace

int main(int argc, char** argv) {
  if (argc != 7) {
    std::cerr << "usage: window_check_screenshot SHOT.png LAYOUT held.csv free.csv PLOT COLUMN\n";
    return 2;
  }
  sf::Image img;
  if (!img.loadFromFile(argv[1])) {
    std::cerr << "cannot read " << argv[1] << "\n";
    return 1;
  }
  std::ifstream lay(argv[2]);
  double W = 0, H = 0;
  int held[3] = {0, 0, 0}, free_[3] = {0, 0, 0};
  Plot alpha;  // the plot checked
  const std::string plot_name = argv[5], column = argv[6];
  for (std::string line; std::getline(lay, line);) {
    std::istringstream ls(line);
    std::string kind;
    ls >> kind;
    if (kind == "size") ls >> W >> H;
    if (kind == "colour") {
      std::string which;
      int r, g, b;
      ls >> which >> r >> g >> b;
      int* dst = which == "held" ? held : free_;
      dst[0] = r, dst[1] = g, dst[2] = b;
    }
    if (kind == "plot") {
      std::string name;
      Plot p;
      ls >> name >> p.p0x >> p.p0y >> p.p1x >> p.p1y >> p.x0 >> p.x1 >> p.y0 >> p.y1 >> p.l0x >> p.l0y >> p.l1x >> p.l1y;
      p.found = static_cast<bool>(ls);
      if (name == plot_name) alpha = p;
    }
  }
  const sf::Vector2u size = img.getSize();
  std::cout << "screenshot " << argv[1] << ": " << size.x << "x" << size.y << "\n";
  check(W > 0 && size.x == static_cast<unsigned>(W) && size.y == static_cast<unsigned>(H),
        "the PNG has the window's size " + std::to_string(static_cast<int>(W)) + "x" + std::to_string(static_cast<int>(H)));

  // not blank: colours and coverage
  {
    std::set<unsigned> colours;
    std::size_t differing = 0;
    const sf::Color bg = img.getPixel(size.x / 2, size.y / 2);
    (void)bg;
    std::vector<std::size_t> hist(64, 0);
    for (unsigned y = 0; y < size.y; y += 2)
      for (unsigned x = 0; x < size.x; x += 2) {
        const sf::Color c = img.getPixel(x, y);
        colours.insert((c.r << 16) | (c.g << 8) | c.b);
        ++hist[(c.r >> 6) * 16 + (c.g >> 6) * 4 + (c.b >> 6)];
      }
    const std::size_t total = (size.x / 2) * (size.y / 2);
    const std::size_t most = *std::max_element(hist.begin(), hist.end());
    differing = total - most;
    check(colours.size() > 200, "not blank: " + std::to_string(colours.size()) + " distinct colours");
    check(differing > total / 20, "not blank: a twentieth or more of the pixels away from the dominant colour band");
  }
  // the status line: a dark band across the bottom, with light text on it
  {
    double lum = 0;
    int light = 0, n = 0;
    for (unsigned x = 0; x < size.x; x += 3)
      for (unsigned y = size.y - 36; y < size.y - 4; ++y) {
        const sf::Color c = img.getPixel(x, y);
        const double l = 0.299 * c.r + 0.587 * c.g + 0.114 * c.b;
        lum += l;
        light += l > 160;
        ++n;
      }
    check(lum / n < 110 && light > 200, "the status line with the cautions is drawn at the bottom");
  }
  // the angle-of-attack plot against the CSVs
  check(alpha.found, "the layout names the plot " + plot_name);
  const Csv h = read_csv(argv[3], column);
  const Csv f = read_csv(argv[4], column);
  check(h.t.size() > 10 && f.t.size() > 10, "both CSVs hold a history of " + column);
  if (failures) return 1;
  auto row_of = [&](double v) { return alpha.p1y - (v - alpha.y0) / (alpha.y1 - alpha.y0) * (alpha.p1y - alpha.p0y); };
  int apart = 0, held_ok = 0, free_ok = 0, together = 0, together_ok = 0;
  for (int x = static_cast<int>(alpha.p0x) + 3; x < static_cast<int>(alpha.p1x) - 3; ++x) {
    const double t = alpha.x0 + (x + 0.5 - alpha.p0x) / (alpha.p1x - alpha.p0x) * (alpha.x1 - alpha.x0);
    const double vh = h.at(t), vf = f.at(t);
    if (!std::isfinite(vh) || !std::isfinite(vf)) continue;
    const double yh = row_of(vh), yf = row_of(vf);
    const auto in_legend = [&](double y) {
      return x >= alpha.l0x - 3 && x <= alpha.l1x + 3 && y >= alpha.l0y - 4 && y <= alpha.l1y + 4;
    };
    if (yh < alpha.p0y + 3 || yh > alpha.p1y - 3 || yf < alpha.p0y + 3 || yf > alpha.p1y - 3) continue;
    if (in_legend(yh) || in_legend(yf)) continue;
    if (std::abs(yh - yf) > 5.0) {
      ++apart;
      held_ok += near(img, alpha, x, yh, held, 3);
      free_ok += near(img, alpha, x, yf, free_, 3);
    } else if (std::abs(yh - yf) < 1.0) {
      ++together;
      together_ok += near(img, alpha, x, yh, held, 3) || near(img, alpha, x, yh, free_, 3);
    }
  }
  std::printf("  %s plot: %d columns with the lines apart (held drawn right in %d, free in %d), "
              "%d together (drawn in %d)\n", plot_name.c_str(), apart, held_ok, free_ok, together, together_ok);
  check(apart >= 20, "held and free differ in the plot after the gust (20 or more columns apart)");
  check(apart > 0 && held_ok >= 0.85 * apart, "the held line is drawn where its CSV puts it");
  check(apart > 0 && free_ok >= 0.45 * apart, "the free (dashed) line is drawn where its CSV puts it");
  check(together == 0 || together_ok >= 0.85 * together, "where the two runs agree a line is drawn there");
  return failures ? 1 : 0;
}
