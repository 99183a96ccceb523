#include "collector/import_support.h"

#include <filesystem>

#include "core/csv.h"
#include "core/sha256.h"

namespace twinprobe {

Result<std::string> FileSha256(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return BadInput(path, "cannot read the file", "check the path");
  Sha256 h;
  std::vector<char> buf(1 << 16);
  while (in) {
    in.read(buf.data(), static_cast<std::streamsize>(buf.size()));
    if (in.gcount() > 0) h.Update(std::string_view(buf.data(), static_cast<size_t>(in.gcount())));
  }
  if (in.bad()) return BadInput(path, "cannot read the file", "check the path");
  return h.HexDigest();
}

int64_t FileSize(const std::string& path) {
  std::error_code ec;
  auto n = std::filesystem::file_size(path, ec);
  return ec ? 0 : static_cast<int64_t>(n);
}

bool IsRejectColumn(const std::string& column) { return column.rfind("reject_", 0) == 0; }

std::string DefaultRejectPath(const std::string& path) { return path + ".rejects.csv"; }

RejectWriter::RejectWriter(std::string path, std::vector<std::string> header)
    : path_(std::move(path)), header_(std::move(header)) {}

Status RejectWriter::Add(int64_t line, const std::string& reason, const std::vector<std::string>& fields) {
  if (!out_) {
    out_ = std::make_unique<std::ofstream>(path_, std::ios::binary | std::ios::trunc);
    if (!*out_) return BadInput(path_, "cannot write the reject file", "check that the folder is writable");
    *out_ << "reject_line,reject_reason";
    for (const auto& h : header_)
      if (!IsRejectColumn(h)) *out_ << ',' << CsvQuote(h);
    *out_ << "\r\n";
  }
  *out_ << line << ',' << CsvQuote(reason);
  for (size_t i = 0; i < fields.size(); ++i)
    if (i >= header_.size() || !IsRejectColumn(header_[i])) *out_ << ',' << CsvQuote(fields[i]);
  *out_ << "\r\n";
  ++rows_;
  if (!*out_) return BadInput(path_, "cannot write the reject file", "check that the folder is writable");
  return {};
}

Status RejectWriter::Close() {
  if (!out_) return {};
  out_->close();
  if (!*out_) return BadInput(path_, "cannot write the reject file", "check that the folder is writable");
  return {};
}

}  // namespace twinprobe
