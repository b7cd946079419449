// Fuzz target: CSV test points, the path `shaftwork rate POINTS.csv --case TEMPLATE.json`
// takes: io::rate_batch over the bytes against a fixed template (the compressor week log's
// template, examples/compressor-week-log.template.json, trimmed), plus io::parse_csv on
// the same bytes. The first byte picks csv or jsonl output and one or two worker threads.
// A whole-input refusal (shaftwork::Error naming the input) is fine; a crash, a sanitizer
// report, a row count that does not add up, or a jsonl line that is not a result object is a
// finding.
#include <cstddef>
#include <cstdint>
#include <cstring>
#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

#include "fuzz_check.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/batch.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/csv_reader.hpp"
#include "shaftwork/io/fluid_factory.hpp"

namespace {

class BytesSource final : public shaftwork::io::ByteSource {
 public:
  explicit BytesSource(std::string_view bytes) : bytes_(bytes) {}
  std::size_t read(char* buffer, std::size_t capacity) override {
    const std::size_t n = std::min(capacity, bytes_.size());
    std::memcpy(buffer, bytes_.data(), n);
    bytes_.remove_prefix(n);
    return n;
  }
  std::size_t size_hint() const override { return bytes_.size(); }

 private:
  std::string_view bytes_;
};

class StringSink final : public shaftwork::io::ByteSink {
 public:
  void write(std::string_view bytes) override { text.append(bytes); }
  std::string text;
};

constexpr std::string_view kTemplate = R"({
  "id": "template",
  "machine": "compressor",
  "fluid": "air",
  "site": { "barometric_pressure": "99.1 kPa" },
  "inlet":  { "pressure": "-1.8 kPag", "temperature": "16.0 degC" },
  "outlet": { "pressure": "2.10 barg", "temperature": "161.3 degC" },
  "standard_volume_flow": "4200 Nm3/h",
  "power": "226.0 kW",
  "mechanical_efficiency": 0.975
})";

const shaftwork::io::BatchTemplate& batch_template() {
  static shaftwork::io::FluidFactory fluids;
  static const shaftwork::io::BatchTemplate templ = shaftwork::io::read_batch_template(
      shaftwork::io::parse_json_strict(kTemplate, "template.json"), "template.json", fluids);
  return templ;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const std::string_view text(reinterpret_cast<const char*>(data + 1), size - 1);

  const auto rows = shaftwork::io::parse_csv(std::string(text));
  for (const auto& row : rows) FUZZ_REQUIRE(row.error.empty() || row.fields.empty());

  shaftwork::io::BatchOptions options;
  options.format = (data[0] & 1) ? shaftwork::io::BatchFormat::jsonl : shaftwork::io::BatchFormat::csv;
  options.jobs = (data[0] & 2) ? 2 : 1;
  options.chunk_bytes = 64 + (data[0] >> 2);  // small chunks: records cross chunk edges
  BytesSource source(text);
  StringSink sink;
  shaftwork::io::BatchSummary summary;
  try {
    summary = shaftwork::io::rate_batch(source, "points.csv", batch_template(), sink, options);
  } catch (const shaftwork::Error& e) {
    FUZZ_REQUIRE(std::string_view(e.what()).find("points.csv") != std::string_view::npos);
    return 0;
  }
  FUZZ_REQUIRE(summary.failed <= summary.rows);
  // jsonl: every line one JSON object with an id and a status, whatever bytes the cells held
  // (ids echo the input, so words like "nan" may appear there; numbers are checked finite
  // where they are made, and JSON cannot spell a non-finite number).
  if (options.format == shaftwork::io::BatchFormat::jsonl) {
    std::size_t lines = 0;
    for (std::size_t at = 0; at < sink.text.size();) {
      const std::size_t end = sink.text.find('\n', at);
      FUZZ_REQUIRE(end != std::string::npos);  // every line ends
      const auto object = nlohmann::json::parse(sink.text.begin() + static_cast<std::ptrdiff_t>(at),
                                                sink.text.begin() + static_cast<std::ptrdiff_t>(end), nullptr, false);
      FUZZ_REQUIRE(object.is_object() && object.contains("id") && object.contains("status"));
      ++lines;
      at = end + 1;
    }
    FUZZ_REQUIRE(lines == summary.rows);
  }
  return 0;
}
