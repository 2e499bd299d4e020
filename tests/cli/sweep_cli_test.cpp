// Sweeps through the command line: results identical whatever the thread
// count, and shards that concatenate to the whole study byte for byte.
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <string>

#include <gtest/gtest.h>

namespace {

namespace fs = std::filesystem;

// Runs a shell command, returns its standard output.
std::string Capture(const std::string& cmd, int* status) {
  std::string out;
  FILE* p = popen(cmd.c_str(), "r");
  if (p == nullptr) return out;
  char buf[65536];
  size_t n;
  while ((n = fread(buf, 1, sizeof buf, p)) > 0) out.append(buf, n);
  *status = pclose(p);
  return out;
}

class SweepCli : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() /
           ("hd_sweep_" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()) + "_" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    fs::create_directories(dir_);
    // A rating grid of 3 x 7 x 11 = 231 points with a solve at every point:
    // the length that gives each duty.
    std::ofstream(dir_ / "grid.deck") << R"(title "sweep grid"
given m = 0.5 kg/s
given cp = 4.19 kJ/(kg*K)
given U = 900 W/(m^2*K)
given D = 25 mm
given T_h1 = 80 degC
given T_c1 = 20 degC
given Q_req = 40 kW
C = m * cp in W/K
solve L from 0.1 m to 500 m so that Q = Q_req
UA = U * pi * D * L in W/K
eps = eff_counter(UA / C, 0.5)
Q = eps * C * (T_h1 - T_c1) in kW
sweep m from 0.4 kg/s to 0.6 kg/s step 0.1 kg/s
sweep U over 600 W/(m^2*K), 700 W/(m^2*K), 800 W/(m^2*K), 900 W/(m^2*K), 1000 W/(m^2*K), 1100 W/(m^2*K), 1200 W/(m^2*K)
sweep Q_req from 20 kW to 45 kW step 2.5 kW
)";
  }
  void TearDown() override { fs::remove_all(dir_); }

  std::string Run(const std::string& args, int* status) {
    return Capture(std::string(HD_BINARY) + " run " + (dir_ / "grid.deck").string() +
                       " -f csv -o - " + args + " 2>/dev/null",
                   status);
  }

  fs::path dir_;
};

TEST_F(SweepCli, SameBytesWhateverTheThreadCount) {
  int s1 = -1, s2 = -1, s8 = -1;
  const std::string one = Run("-j 1", &s1);
  const std::string two = Run("-j 2", &s2);
  const std::string eight = Run("-j 8", &s8);
  EXPECT_EQ(s1, 0);
  EXPECT_EQ(s2, 0);
  EXPECT_EQ(s8, 0);
  // Header plus one line per point.
  EXPECT_EQ(std::count(one.begin(), one.end(), '\n'), 1 + 3 * 7 * 11);
  EXPECT_EQ(one, two);
  EXPECT_EQ(one, eight);
}

TEST_F(SweepCli, ShardsConcatenateToTheWholeStudy) {
  int status = -1;
  const std::string whole = Run("-j 2", &status);
  ASSERT_EQ(status, 0);
  for (int n : {1, 2, 3, 7}) {
    std::string joined;
    for (int k = 1; k <= n; ++k) {
      int s = -1;
      joined += Run("-j 2 --shard " + std::to_string(k) + "/" + std::to_string(n), &s);
      ASSERT_EQ(s, 0) << k << "/" << n;
    }
    EXPECT_EQ(joined, whole) << n << " shards";
  }
}

TEST_F(SweepCli, ChosenColumnsFollowTheSweptInputs) {
  int status = -1;
  const std::string csv = Run("--columns L,Q", &status);
  ASSERT_EQ(status, 0);
  EXPECT_EQ(csv.substr(0, csv.find('\n')), "m [kg/s],U [W/(m^2*K)],Q_req [kW],L [m],Q [kW],error");
  // The second point: m = 0.4 kg/s, U = 600, Q_req = 22.5 kW; the solve made Q
  // equal Q_req to 1e-10 relative.
  std::istringstream in(csv);
  std::string header, first, second;
  std::getline(in, header);
  std::getline(in, first);
  std::getline(in, second);
  EXPECT_EQ(second.rfind("0.4,600,22.5,", 0), 0u) << second;
  const double q = std::stod(second.substr(second.rfind(',', second.size() - 2) + 1));
  EXPECT_NEAR(q, 22.5, 22.5 * 1e-9) << second;
}

TEST_F(SweepCli, BadShardIsAUsageError) {
  int status = -1;
  Run("--shard 4/3", &status);
  EXPECT_EQ(WEXITSTATUS(status), 3);
  Run("--shard x", &status);
  EXPECT_EQ(WEXITSTATUS(status), 3);
}

}  // namespace
