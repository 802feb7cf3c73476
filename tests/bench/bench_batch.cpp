// Benchmark of `tidewright chem --batch` (issue 16): rows per second and peak memory for
// 1e5, 1e6 and 1e7 alkalinity-DIC rows, against the floor program bench_batch_floor (same
// reading and parsing, 15 numbers printed per row, no chemistry). Prints figures; never fails
// on them. Goals: within 2.5x of the floor per core, peak memory under 64 MB at every size.
//   bench_batch [ROWS ...]      (default 100000 1000000 10000000)
// Each size is written once to a temporary file (rows vary in salinity 30-36, temperature
// 20-30 C, alkalinity 2000-2600 and DIC, so no two rows share their constants), then each
// program runs in its own process with output to /dev/null; wall time, CPU time (user +
// system) and peak resident memory (getrusage ru_maxrss of that child) are printed.
#include <fcntl.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <iterator>
#include <string>
#include <vector>

#include <fmt/format.h>

extern char** environ;

namespace {

struct Run {
  double wall_s = 0, cpu_s = 0, peak_mb = 0;
  int status = 0;
};

Run run(const std::vector<std::string>& args) {
  std::vector<char*> argv;
  for (const auto& a : args) argv.push_back(const_cast<char*>(a.c_str()));
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 2, "/dev/null", O_WRONLY, 0);
  Run r;
  const auto t0 = std::chrono::steady_clock::now();
  pid_t pid = 0;
  if (posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ) != 0) {
    r.status = -1;
    return r;
  }
  struct rusage usage {};
  int status = 0;
  wait4(pid, &status, 0, &usage);
  r.wall_s = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  r.cpu_s = static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) +
            static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec) * 1e-6;
  r.peak_mb = static_cast<double>(usage.ru_maxrss) / 1024.0;  // ru_maxrss is in KiB on Linux
  r.status = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  posix_spawn_file_actions_destroy(&actions);
  return r;
}

// N rows of salinity, temperature_c, alkalinity_umol_kg, dic_umol_kg (a fixed pseudo-random
// sequence, so every run measures the same text).
bool write_rows(const std::string& path, long long rows) {
  std::FILE* f = std::fopen(path.c_str(), "wb");
  if (!f) return false;
  std::string buf = "salinity,temperature_c,alkalinity_umol_kg,dic_umol_kg\n";
  unsigned long long x = 88172645463325252ULL;
  auto next = [&] {  // xorshift64
    x ^= x << 13;
    x ^= x >> 7;
    x ^= x << 17;
    return static_cast<double>(x >> 11) / 9007199254740992.0;
  };
  for (long long i = 0; i < rows; ++i) {
    const double s = 30 + 6 * next(), t = 20 + 10 * next(), alk = 2000 + 600 * next();
    const double dic = alk * (0.84 + 0.08 * next());
    fmt::format_to(std::back_inserter(buf), "{:.2f},{:.2f},{:.1f},{:.1f}\n", s, t, alk, dic);
    if (buf.size() > (1u << 20)) {
      std::fwrite(buf.data(), 1, buf.size(), f);
      buf.clear();
    }
  }
  std::fwrite(buf.data(), 1, buf.size(), f);
  return std::fclose(f) == 0;
}

void print(const char* what, long long rows, const Run& r) {
  std::printf("  %-34s %8.2f s wall %8.2f s CPU  %10.0f rows/s wall %10.0f rows/CPU-s  peak %6.1f MB%s\n",
              what, r.wall_s, r.cpu_s, rows / r.wall_s, rows / r.cpu_s, r.peak_mb,
              r.status == 0 ? "" : "  (exit status not 0!)");
}

}  // namespace

int main(int argc, char** argv) {
  std::vector<long long> sizes;
  for (int i = 1; i < argc; ++i) sizes.push_back(std::atoll(argv[i]));
  if (sizes.empty()) sizes = {100000, 1000000, 10000000};
  const std::string cli = TW_CLI_PATH, floor = TW_FLOOR_PATH;
  const std::string dir = std::getenv("TMPDIR") ? std::getenv("TMPDIR") : "/tmp";
  std::printf("chem --batch, alkalinity + DIC rows (goals: <= 2.5x the floor per core, peak < 64 MB)\n");
  for (long long n : sizes) {
    const std::string path = fmt::format("{}/tw_bench_batch_{}_{}.csv", dir, n, getpid());
    if (!write_rows(path, n)) {
      std::printf("cannot write %s\n", path.c_str());
      return 1;
    }
    std::printf("%lld rows:\n", n);
    const Run f = run({floor, path});
    print("floor (parse, print 15 numbers)", n, f);
    const Run b1 = run({cli, "chem", "--batch", path});
    print("tidewright chem --batch", n, b1);
    const Run b2 = run({cli, "chem", "--batch", path, "--threads", "2"});
    print("tidewright chem --batch --threads 2", n, b2);
    std::printf("  ratio to the floor per core (CPU time): %.2fx (goal <= 2.5x); with 2 threads, "
                "wall time %.2fx of 1 thread\n",
                b1.cpu_s / f.cpu_s, b2.wall_s / b1.wall_s);
    std::remove(path.c_str());
  }
  return 0;
}
