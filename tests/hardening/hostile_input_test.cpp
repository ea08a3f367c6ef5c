// Hostile and extreme inputs for the readers: huge and tiny numbers, empty files, over-long lines,
// binary bytes, files and gzip streams past the 2 GiB limit.  Every case is a constructed case.
#include "plumb/model/labels.hpp"
#include "plumb/model/read.hpp"
#include "plumb/numeric/rational.hpp"
#include "plumb/run/budget.hpp"

#include <gtest/gtest.h>
#include <sys/resource.h>
#include <unistd.h>
#include <zlib.h>

#include <filesystem>
#include <fstream>
#include <string>

namespace plumb::model {
namespace {

namespace fs = std::filesystem;
using numeric::Integer;
using numeric::Rational;

// A folder of its own under the system temp dir, removed afterwards.
class HostileInput : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::temp_directory_path() / ("plumb-hostile-" + std::to_string(getpid()));
    fs::create_directories(folder_);
  }
  void TearDown() override { fs::remove_all(folder_); }
  std::string write(const std::string& name, const std::string& bytes) {
    fs::path path = folder_ / name;
    std::ofstream(path, std::ios::binary).write(bytes.data(), static_cast<std::streamsize>(bytes.size()));
    return path.string();
  }
  fs::path folder_;
};

Integer ten_to(unsigned exponent) {
  Integer result = 1;
  for (unsigned k = 0; k < exponent; ++k) result *= 10;
  return result;
}

// The InputError message for reading `text` as MPS, or "" when it reads.
std::string mps_error(const std::string& text) {
  try {
    read_model_text(text, "hostile.mps");
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

std::string error_reading(const std::string& path) {
  try {
    read_model(path);
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

long peak_resident_kib() {
  rusage usage{};
  getrusage(RUSAGE_SELF, &usage);
  return usage.ru_maxrss;
}

constexpr const char* tiny_model =
    "NAME tiny\nROWS\n N cost\n L cap\nCOLUMNS\n x cost 1 cap 1\nRHS\n rhs cap 4\nENDATA\n";

TEST_F(HostileInput, ExtremeCoefficientsReadExactly) {
  // Constructed case: 1e+300, 1e-300 and a 500-digit decimal must arrive as exact rationals.
  std::string digits;
  for (int k = 0; k < 50; ++k) digits += "1234567890";
  std::string half = digits.substr(0, 250) + "." + digits.substr(250);
  std::string text = "NAME extreme\nROWS\n N cost\n L big\n G tiny\nCOLUMNS\n"
                     " x cost 1 big 1e+300\n x tiny 1e-300\n"
                     " y cost " + digits + " big -" + half + "\n"
                     "RHS\n rhs big 1E300 tiny 1.0e-300\nENDATA\n";
  Model m = read_model_text(text, "extreme.mps");
  int big = *m.find_row("big"), tiny = *m.find_row("tiny");
  int x = *m.find_column("x"), y = *m.find_column("y");
  EXPECT_EQ(m.matrix.at(big, x), Rational(ten_to(300)));
  EXPECT_EQ(m.matrix.at(tiny, x), Rational(Integer(1), ten_to(300)));
  EXPECT_EQ(m.objective.coefficients[y], Rational(Integer(digits)));
  EXPECT_EQ(m.matrix.at(big, y), -Rational(Integer(digits), ten_to(250)));
  EXPECT_EQ(*m.rows[big].upper, Rational(ten_to(300)));
  EXPECT_EQ(*m.rows[tiny].lower, Rational(Integer(1), ten_to(300)));
}

TEST_F(HostileInput, HugeExponentsAreRefusedNotExpanded) {
  // Constructed case: an exponent past max_decimal_exponent would need megabytes per number.
  EXPECT_FALSE(numeric::parse_decimal("1e100001"));
  EXPECT_FALSE(numeric::parse_decimal("1e-999999999999999999999"));
  EXPECT_TRUE(numeric::parse_decimal("1e-100000"));
  // The limit is on the value (numerator and denominator in lowest terms at most 1e100000), not
  // on its text, so whatever is accepted reads back from any exact rendering of it.  Found by the
  // numbers fuzzer: "1999e99999" printed as 1.999e+100002, "-1.1321e325/14189016789e-99999".
  EXPECT_EQ(numeric::parse_decimal("0.1e-99999"), numeric::parse_decimal("1e-100000"));
  EXPECT_EQ(numeric::parse_decimal("100e99998"), numeric::parse_decimal("1e100000"));
  EXPECT_FALSE(numeric::parse_decimal("1999e99999"));
  EXPECT_FALSE(numeric::parse_decimal("0.5e-100000"));  // 1/(2e100000)
  EXPECT_TRUE(numeric::parse_number("1e50000/1e-50000"));
  EXPECT_FALSE(numeric::parse_number("1e99999/1e-99999"));
  EXPECT_FALSE(numeric::parse_number("-1.1321e325/14189016789e-99999"));
  auto third = numeric::parse_number("1e99999/3");
  ASSERT_TRUE(third);
  EXPECT_EQ(numeric::parse_number(numeric::to_fraction(*third)), third);
  std::string text = tiny_model;
  text.replace(text.find("cap 4"), 5, "cap 1e999999999");
  EXPECT_NE(mps_error(text).find(":8:"), std::string::npos) << mps_error(text);
}

TEST_F(HostileInput, EmptyFilesAreRefused) {
  // Constructed case: nothing, blank lines, comments only; on disk, and as an empty gzip member.
  for (const std::string& text : {std::string(), std::string("\n\n   \n\t\n"), std::string("* only a comment\n")})
    EXPECT_NE(mps_error(text).find("empty"), std::string::npos) << "for \"" << text << "\": " << mps_error(text);
  EXPECT_NE(error_reading(write("empty.mps", "")).find("empty"), std::string::npos);
  const char empty_gzip[] = "\x1f\x8b\x08\x00\x00\x00\x00\x00\x00\x03\x03\x00\x00\x00\x00\x00\x00\x00\x00\x00";
  EXPECT_NE(error_reading(write("empty.mps.gz", std::string(empty_gzip, sizeof empty_gzip - 1))).find("empty"),
            std::string::npos);
}

TEST_F(HostileInput, OverLongLinesAreRefusedWithTheirLength) {
  // Constructed case: a 70 000-character comment, and 8 MiB without a newline.
  std::string text = tiny_model;
  text.insert(0, "*" + std::string(70000, 'x') + "\n");
  EXPECT_NE(mps_error(text).find("hostile.mps:1:"), std::string::npos) << mps_error(text);
  EXPECT_NE(mps_error(text).find("70001 characters"), std::string::npos) << mps_error(text);
  EXPECT_NE(mps_error(std::string(8 << 20, 'A')).find("characters"), std::string::npos);
}

TEST_F(HostileInput, BinaryBytesAreRefusedWhereTheyStand) {
  // Constructed case: a NUL in the middle of a data line, and random-looking binary data.
  std::string text = tiny_model;
  text[text.find("cap 1")] = '\0';
  EXPECT_NE(mps_error(text).find("hostile.mps:6:"), std::string::npos) << mps_error(text);
  EXPECT_NE(mps_error(text).find("0x00"), std::string::npos) << mps_error(text);
  EXPECT_NE(mps_error("\x7f" "ELF\x02\x01\x01").find("control byte"), std::string::npos);
}

TEST_F(HostileInput, FilesOverTwoGibibytesAreRefusedBeforeReading) {
  // Constructed case: a sparse file one byte past 2 GiB (no disk space, no memory used).
  std::string path = write("huge.mps", "");
  fs::resize_file(path, (std::uintmax_t(2) << 30) + 1);
  long before = peak_resident_kib();
  EXPECT_NE(error_reading(path).find("larger than 2 GiB"), std::string::npos) << error_reading(path);
  EXPECT_LT(peak_resident_kib() - before, 64 * 1024);
}

// A gzip member expanding to `mebibytes` MiB of zeros, built without deflating them all: after a
// sync flush, compressing another MiB of zeros yields the same bytes, so those are repeated.
// `stated_size` is written as the trailer's size field (the true size modulo 2^32 unless lying).
std::string zero_bomb(unsigned mebibytes, std::uint32_t stated_size) {
  const std::string zeros(1 << 20, '\0');
  z_stream stream{};
  deflateInit2(&stream, 9, Z_DEFLATED, 16 + MAX_WBITS, 9, Z_DEFAULT_STRATEGY);
  auto compress_mebibyte = [&] {
    std::string out(1 << 16, '\0');
    stream.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(zeros.data()));
    stream.avail_in = static_cast<uInt>(zeros.size());
    stream.next_out = reinterpret_cast<Bytef*>(out.data());
    stream.avail_out = static_cast<uInt>(out.size());
    deflate(&stream, Z_SYNC_FLUSH);
    out.resize(out.size() - stream.avail_out);
    return out;
  };
  std::string bomb = compress_mebibyte();  // gzip header and the first MiB
  std::string repeated = compress_mebibyte();
  deflateEnd(&stream);
  for (unsigned k = 1; k < mebibytes; ++k) bomb += repeated;
  uLong crc_mebibyte = crc32(0, reinterpret_cast<const Bytef*>(zeros.data()), static_cast<uInt>(zeros.size()));
  uLong crc = crc_mebibyte;
  for (unsigned k = 1; k < mebibytes; ++k) crc = crc32_combine(crc, crc_mebibyte, zeros.size());
  bomb += std::string("\x03\x00", 2);  // an empty final block with fixed codes
  for (std::uint32_t word : {static_cast<std::uint32_t>(crc), stated_size})
    for (int k = 0; k < 4; ++k) bomb += static_cast<char>(word >> (8 * k) & 0xff);
  return bomb;
}

TEST_F(HostileInput, ZeroBombBuilderMakesARealGzipFile) {
  // The builder itself, on a size that may be read: exactly 3 MiB of zeros come out, one line.
  std::string path = write("three.mps.gz", zero_bomb(3, 3u << 20));
  EXPECT_NE(error_reading(path).find("a line of 3145728 characters"), std::string::npos) << error_reading(path);
}

TEST_F(HostileInput, GzipBombStatingItsSizeIsRefusedAtOnce) {
  // Constructed case: 2 MB on disk expanding to 2 GiB + 1 MiB; the trailer says so.
  std::string path = write("bomb.mps.gz", zero_bomb(2049, (2049u << 20)));
  long before = peak_resident_kib();
  EXPECT_NE(error_reading(path).find("after decompression"), std::string::npos) << error_reading(path);
  EXPECT_LT(peak_resident_kib() - before, 64 * 1024);
}

TEST_F(HostileInput, GzipBombInManyMembersIsRefusedWithoutKeepingItsExpansion) {
  // Constructed case: three honest 1 GiB members (each trailer true), so only decompressing
  // finds the total; that pass must keep nothing but its buffer.
  std::string member = zero_bomb(1024, 1u << 30);
  std::string path = write("members.mps.gz", member + member + member);
  long before = peak_resident_kib();
  EXPECT_NE(error_reading(path).find("more than 2 GiB after decompression"), std::string::npos)
      << error_reading(path);
  EXPECT_LT(peak_resident_kib() - before, 64 * 1024);
}

// How far a read got when an interrupt stopped it, or "" when it was not stopped.  The flag is
// set before reading, as a signal arriving just after `plumb solve` installed its handlers would.
template <class Read>
std::string progress_when_interrupted(Read read) {
  run::interrupt_flag().store(true);
  std::string progress;
  try {
    read();
  } catch (const run::Stopped& stopped) {
    EXPECT_EQ(stopped.reason, run::StopReason::interrupted);
    progress = stopped.progress;
  }
  run::interrupt_flag().store(false);
  return progress;
}

TEST_F(HostileInput, ReadersStopAtOnceOnAnInterrupt) {
  // Constructed case: every reader polls the interrupt flag from its first line on, and says where.
  EXPECT_EQ(progress_when_interrupted([] { read_model_text(tiny_model, "tiny.mps"); }), "reading tiny.mps, at line 1");
  EXPECT_EQ(progress_when_interrupted([] { read_model_text("var x >= 0\nminimise x\n", "tiny.plumb"); }),
            "reading tiny.plumb, at line 1");
  Model m = read_model_text(tiny_model, "tiny.mps");
  EXPECT_EQ(progress_when_interrupted([&] { apply_labels_text(m, "name,kind,statement\n", "tiny.labels.csv"); }),
            "reading tiny.labels.csv, at line 1");
  std::string gz = write("zeros.mps.gz", zero_bomb(1, 1u << 20));
  EXPECT_EQ(progress_when_interrupted([&] { read_model(gz); }), "decompressing " + gz + ", after 0 MiB");
  EXPECT_EQ(error_reading(write("tiny.mps", tiny_model)), "") << "the flag is cleared again";
}

}  // namespace
}  // namespace plumb::model
