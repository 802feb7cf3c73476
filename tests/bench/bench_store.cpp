// Benchmark (prints figures, not a test): the journal database at farm scale against the
// JSON-file journal it replaces. Invented data, generated here (nothing big is committed):
// 30 systems x 10 years of daily tests of five parameters (alkalinity, calcium, magnesium,
// pH, salinity), a daily alkalinity dose, a calcium dose every other day and a weekly water
// change: about 730,000 events.
//
// Figures, each the median of several runs (wall time) and the largest peak memory (maxrss):
//   1. every `tidewright` command as a user runs it (a child process: start-up included) --
//      import of the whole farm as CSV, one add, the demand estimate of one system, the list of
//      one system's last 100 events, systems, exports, the integrity check, and the JSON export
//      imported and restored again (streamed, one event at a time);
//   2. the same operations inside one process through the store API (no start-up);
//   3. the JSON-file journal way (read and parse the whole file; an add also writes it all
//      back), in a child process each, and the ratio JSON / database.
// Targets (issue 17): one add < 20 ms, demand of one system < 100 ms, last 100 events < 20 ms,
// peak memory < 64 MB for every command.
//   TW_BENCH_SYSTEMS, TW_BENCH_YEARS: a smaller farm;  TW_BENCH_SKIP_JSON=1: no JSON figures;
//   TW_BENCH_DIR=dir: build the farm database in dir once and keep it; a later run with the
//   same dir reuses it and skips the import (minutes of wall time on a busy machine), e.g. to
//   compare the reads before and after a change or to profile one command.
#include <sys/resource.h>
#include <time.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <random>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/estimate/estimate.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/store/journal_store.hpp"

namespace fs = std::filesystem;
using namespace tw;
using Clock = std::chrono::steady_clock;

namespace {

struct Figure {
  double ms = 0;      // wall time
  double cpu_ms = 0;  // user + system CPU time: the fair figure on a shared, busy machine
  long max_rss_kb = 0;
};

double cpu_now_ms() {
  timespec t{};
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &t);
  return t.tv_sec * 1e3 + t.tv_nsec / 1e6;
}

double median(std::vector<double> v) {
  std::sort(v.begin(), v.end());
  return v[v.size() / 2];
}

// Runs fn in a child process; wall time and the child's peak resident memory.
Figure in_child(const std::function<int()>& fn) {
  std::fflush(stdout);  // or the child would print the parent's buffered text again
  const auto t0 = Clock::now();
  const pid_t pid = fork();
  if (pid == 0) _exit(fn());
  int status = 0;
  rusage ru{};
  wait4(pid, &status, 0, &ru);
  const double ms = std::chrono::duration<double, std::milli>(Clock::now() - t0).count();
  if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) std::fprintf(stderr, "  (child failed: status %d)\n", status);
  const double cpu = (ru.ru_utime.tv_sec + ru.ru_stime.tv_sec) * 1e3 + (ru.ru_utime.tv_usec + ru.ru_stime.tv_usec) / 1e3;
  return {ms, cpu, ru.ru_maxrss};
}

Figure run_command(const std::string& binary, const std::vector<std::string>& args, int runs) {
  std::vector<double> times, cpus;
  long rss = 0;
  for (int r = 0; r < runs; ++r) {
    Figure f = in_child([&] {
      std::vector<char*> argv;
      argv.push_back(const_cast<char*>(binary.c_str()));
      for (const auto& a : args) argv.push_back(const_cast<char*>(a.c_str()));
      argv.push_back(nullptr);
      if (!freopen("/dev/null", "w", stdout)) return 1;
      execv(binary.c_str(), argv.data());
      return 127;
    });
    times.push_back(f.ms);
    cpus.push_back(f.cpu_ms);
    rss = std::max(rss, f.max_rss_kb);
  }
  return {median(times), median(cpus), rss};
}

void print(const char* what, const Figure& f, const char* target = "") {
  std::printf("  %-50s %9.1f ms wall %9.1f ms CPU  peak %6.1f MB%s\n", what, f.ms, f.cpu_ms, f.max_rss_kb / 1024.0,
              target);
}

// Median wall and CPU time of fn over runs.
template <class F>
std::pair<double, double> median_ms(int runs, F&& fn) {
  std::vector<double> t, c;
  for (int r = 0; r < runs; ++r) {
    const auto t0 = Clock::now();
    const double c0 = cpu_now_ms();
    fn();
    c.push_back(cpu_now_ms() - c0);
    t.push_back(std::chrono::duration<double, std::milli>(Clock::now() - t0).count());
  }
  return {median(t), median(c)};
}

std::string system_name(int s) { return fmt::format("System {:02d}", s + 1); }

// The farm as long-form CSV (journal_csv.hpp columns), written row by row.
std::size_t write_farm_csv(const std::string& path, int systems, int days) {
  std::ofstream out(path);
  out << "time,system,type,parameter,value,unit,ph_scale,additive,amount,amount_unit,volume,volume_unit\n";
  std::mt19937_64 rng(17);
  std::normal_distribution<double> n01(0.0, 1.0);
  // The farm's last day is yesterday (UTC): a fixed start date would, as years pass, put rows
  // in the future, which the journal refuses.
  const std::int64_t today = std::chrono::duration_cast<std::chrono::seconds>(
                                 std::chrono::system_clock::now().time_since_epoch()).count() / 86400 * 86400;
  const std::int64_t start = today - 86400LL * days;
  std::size_t rows = 0;
  for (int d = 0; d < days; ++d) {
    for (int s = 0; s < systems; ++s) {
      const std::string name = system_name(s);
      const std::int64_t day = start + 86400LL * d + 60LL * s;
      auto at = [&](int hour) { return datetime::format_iso8601_utc(day + 3600LL * hour); };
      out << fmt::format("{},{},test,alkalinity,{:.2f},dKH,,,,,,\n", at(8), name, 8.0 + 0.2 * n01(rng));
      out << fmt::format("{},{},test,calcium,{:.0f},mg/L,,,,,,\n", at(8), name, 430 + 10 * n01(rng));
      out << fmt::format("{},{},test,magnesium,{:.0f},mg/L,,,,,,\n", at(8), name, 1320 + 25 * n01(rng));
      out << fmt::format("{},{},test,ph,{:.2f},pH,nbs,,,,,\n", at(9), name, 8.1 + 0.05 * n01(rng));
      out << fmt::format("{},{},test,salinity,{:.1f},psu,,,,,,\n", at(9), name, 35 + 0.3 * n01(rng));
      out << fmt::format("{},{},dose,,,,,sodium_carbonate,{:.1f},g,,\n", at(20), name, 14.0);
      rows += 6;
      if (d % 2 == 0) {
        out << fmt::format("{},{},dose,,,,,calcium_chloride_dihydrate,{:.1f},g,,\n", at(21), name, 20.0);
        ++rows;
      }
      if (d % 7 == 6) {
        out << fmt::format("{},{},water_change,,,,,,,,50,L\n", at(12), name);
        ++rows;
      }
    }
  }
  return rows;
}

// The demand estimate of one system from a journal, as `tidewright demand` computes it.
double estimate_system(const journal::Journal& j, journal::SystemId id) {
  auto series = estimate::series_from_journal(j, id);
  if (!series) return -1;
  double now = 0, sum = 0;
  for (auto p : estimate::kAllParameters) {
    const auto& ev = series->of(p).events;
    if (!ev.empty()) now = std::max(now, estimate::time_of(ev.back()));
  }
  for (auto p : estimate::kAllParameters) {
    auto e = estimate::estimate_series(series->of(p), estimate::default_filter_options(p), now);
    if (e) sum += e->demand_per_day;
  }
  return sum;
}

std::string read_all(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

}  // namespace

int main(int argc, char** argv) {
  const int systems = std::getenv("TW_BENCH_SYSTEMS") ? std::atoi(std::getenv("TW_BENCH_SYSTEMS")) : 30;
  const int years = std::getenv("TW_BENCH_YEARS") ? std::atoi(std::getenv("TW_BENCH_YEARS")) : 10;
  const bool skip_json = std::getenv("TW_BENCH_SKIP_JSON") != nullptr;
  const std::string binary = argc > 1 ? argv[1] : (fs::canonical("/proc/self/exe").parent_path().parent_path() / "shell" / "tidewright").string();
  const char* keep_dir = std::getenv("TW_BENCH_DIR");
  const fs::path dir = keep_dir ? fs::path(keep_dir) : fs::temp_directory_path() / fmt::format("tw_bench_store_{}", getpid());
  fs::create_directories(dir);
  const std::string db = (dir / "farm.db").string(), csv = (dir / "farm.csv").string(), json = (dir / "farm.json").string();
  const std::string target = system_name(systems / 4);
  // A kept farm is reused only when its import finished (the marker is written after it).
  const fs::path imported_marker = dir / fmt::format("imported-{}x{}", systems, years);
  const bool reuse = keep_dir && fs::exists(imported_marker);

  std::printf("journal store benchmark: %d systems x %d years (invented data), binary %s\n", systems, years, binary.c_str());
  if (keep_dir && !reuse) fs::remove(db);
  if (!reuse) {
    auto st = store::JournalStore::open(db);
    if (!st) {
      std::fprintf(stderr, "%s\n", st.error().message.c_str());
      return 1;
    }
    for (int s = 0; s < systems; ++s) {
      journal::System sys;
      sys.name = system_name(s);
      sys.volume_l = 400 + 50 * s;
      if (!(*st)->add_system(sys)) return 1;
    }
  }
  std::printf("1. commands (child process, start-up included; median wall time, largest peak memory)\n");
  if (reuse) {
    std::printf("  farm database kept from an earlier run in %s (import not measured)\n", dir.c_str());
  } else {
    const std::size_t rows = write_farm_csv(csv, systems, 365 * years);
    std::printf("  generated %zu CSV rows (%.1f MB)\n", rows, fs::file_size(csv) / 1e6);
    print("log import farm.csv (whole farm, one transaction)", run_command(binary, {"log", "--journal", db, "import", csv}, 1));
    if (keep_dir) std::ofstream(imported_marker) << "done\n";
  }
  std::printf("  database %.1f MB\n", fs::file_size(db) / 1e6);
  print("tidewright --version (process start only)", run_command(binary, {"--version"}, 5));
  print("log add test (one add)", run_command(binary, {"log", "--journal", db, "add", "test", "--system", target,
                                                       "--parameter", "alkalinity", "--value", "8.1"}, 7),
        "   target < 20 ms");
  print("demand --system (one system, ~24,000 events)", run_command(binary, {"demand", "--journal", db, "--system", target}, 5),
        "   target < 100 ms");
  print("log list --system --last 100", run_command(binary, {"log", "--journal", db, "list", "--system", target, "--last", "100"}, 7),
        "   target < 20 ms");
  print("log systems", run_command(binary, {"log", "--journal", db, "systems"}, 5));
  print("log export --format csv --system (one system)",
        run_command(binary, {"log", "--journal", db, "export", "--system", target, "-o", (dir / "one.csv").string()}, 3));
  print("log export --format json (whole journal, streamed)",
        run_command(binary, {"log", "--journal", db, "export", "--format", "json", "-o", json}, 1));
  print("log check (every record validated)", run_command(binary, {"log", "--journal", db, "check"}, 1));
  {
    // The JSON export read back one event at a time (journal_stream.hpp): into a new database,
    // then as a restore over it (which first keeps a copy of the journal as it was).
    const std::string copy = (dir / "from-json.db").string();
    for (const char* tail : {"", "-wal", "-shm"}) fs::remove(copy + tail);
    print("log import farm.json (streamed, into a new database)",
          run_command(binary, {"log", "--journal", copy, "import", json}, 1));
    print("log restore farm.json (streamed, over that database)",
          run_command(binary, {"log", "--journal", copy, "restore", json}, 1));
    for (const auto& entry : fs::directory_iterator(dir)) {
      if (entry.path().filename().string().rfind("from-json.db", 0) == 0) fs::remove(entry.path());
    }
  }
  std::printf("  every command's peak memory target: < 64 MB\n");

  std::printf("2. inside one process (store API, database open)\n");
  journal::SystemId target_id = 0;
  {
    auto st = std::move(store::JournalStore::open(db)).value();
    target_id = st->system_by_name(target)->id;
    std::int64_t t = 1800000000;
    const auto add_ms = median_ms(21, [&] {
      journal::TestResult r{journal::Parameter::Alkalinity, "", 8.1, "dKH", std::nullopt, std::nullopt, ""};
      (void)st->add_event(journal::Event{0, target_id, t++, "", r});
    });
    std::printf("  %-50s %9.2f ms wall %9.2f ms CPU   target < 20 ms\n", "add_event (one transaction, synchronous=FULL)",
                add_ms.first, add_ms.second);
    double check = 0;
    const auto demand_ms = median_ms(5, [&] {
      auto j = st->system_journal(target_id);
      check += estimate_system(*j, target_id);
    });
    std::printf("  %-50s %9.2f ms wall %9.2f ms CPU   target < 100 ms\n", "system_journal + demand estimate of one system",
                demand_ms.first, demand_ms.second);
    std::size_t seen = 0;
    const auto last_ms = median_ms(21, [&] {
      store::JournalStore::Query q;
      q.filter.system_id = target_id;
      q.newest_first = true;
      q.limit = 100;
      (void)st->for_each_event(q, [&](const journal::Event&) { ++seen; return true; });
    });
    std::printf("  %-50s %9.3f ms wall %9.3f ms CPU   target < 20 ms\n", "last 100 events of one system", last_ms.first,
                last_ms.second);
    std::printf("  (checksums %.3f, %zu)\n", check, seen);
  }

  if (!skip_json) {
    std::printf("3. the JSON-file journal (whole file read and parsed each time; %.1f MB), child process each\n",
                fs::file_size(json) / 1e6);
    const Figure jadd = in_child([&] {
      auto parsed = journal::parse_journal(read_all(json));
      if (!parsed) return 1;
      journal::Journal j = std::move(parsed).value();
      journal::TestResult r{journal::Parameter::Alkalinity, "", 8.1, "dKH", std::nullopt, std::nullopt, ""};
      (void)journal::add_event(j, journal::Event{0, target_id, 1900000000, "", r});
      std::ofstream((dir / "farm.json.tmp").string()) << journal::serialize_journal(j);
      fs::rename(dir / "farm.json.tmp", dir / "farm2.json");
      return 0;
    });
    const Figure jdemand = in_child([&] {
      auto j = journal::parse_journal(read_all(json));
      return j && estimate_system(*j, target_id) > -1 ? 0 : 1;
    });
    const Figure jlast = in_child([&] {
      auto j = journal::parse_journal(read_all(json));
      journal::EventFilter f;
      f.system_id = target_id;
      return j && select_events(*j, f).size() >= 100 ? 0 : 1;
    });
    print("JSON: one add (parse, add, write the whole file)", jadd);
    print("JSON: demand of one system", jdemand);
    print("JSON: last 100 events of one system", jlast);
    const Figure dadd = run_command(binary, {"log", "--journal", db, "add", "note", "--system", target, "--text", "x"}, 5);
    const Figure ddemand = run_command(binary, {"demand", "--journal", db, "--system", target}, 3);
    const Figure dlast = run_command(binary, {"log", "--journal", db, "list", "--system", target, "--last", "100"}, 5);
    std::printf("  ratio JSON / database (command, CPU time and peak memory): add %.0fx, %.0fx; demand %.1fx, %.0fx; "
                "last 100 %.0fx, %.0fx\n",
                jadd.cpu_ms / dadd.cpu_ms, double(jadd.max_rss_kb) / dadd.max_rss_kb, jdemand.cpu_ms / ddemand.cpu_ms,
                double(jdemand.max_rss_kb) / ddemand.max_rss_kb, jlast.cpu_ms / dlast.cpu_ms,
                double(jlast.max_rss_kb) / dlast.max_rss_kb);
  }
  if (!keep_dir) fs::remove_all(dir);
  return 0;
}
