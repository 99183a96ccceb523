#include "collector/import_support.h"

#include <filesystem>

#include "core/csv.h"
#include "core/input_file.h"
#include "core/progress.h"
#include "core/sha256.h"
#include "core/suggest.h"
#include "core/spreadsheet_cell.h"

namespace twinprobe {

Result<std::string> FileSha256(const std::string& path) {
  if (Status regular = CheckRegularInput(path); !regular.ok()) return regular.error();
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

Result<std::vector<std::string>> CheckImportColumns(const std::string& path, const std::vector<std::string>& header,
                                                    const std::vector<std::string>& known,
                                                    const std::vector<std::string>& required,
                                                    const std::string& columns_fix) {
  std::vector<std::string> unknown;
  for (const auto& h : header)
    if (FindColumn(known, h) < 0) unknown.push_back(h);
  for (const auto& column : required)
    if (FindColumn(header, column) < 0)
      return BadInput(path + ":1", "the column '" + column + "' is missing" + DidYouMean(column, unknown), columns_fix);
  std::vector<std::string> ignored;
  for (const auto& h : unknown)
    if (!IsRejectColumn(h)) ignored.push_back(h);
  return ignored;
}

std::string DefaultRejectPath(const std::string& path) { return path + ".rejects.csv"; }

RejectWriter::RejectWriter(std::string path, std::vector<std::string> header, std::string input, bool raw_cells)
    : path_(std::move(path)), header_(std::move(header)), input_(std::move(input)), raw_cells_(raw_cells) {}

Status RejectWriter::Add(int64_t line, const std::string& reason, const std::vector<std::string>& fields) {
  auto cell = [&](const std::string& text) { return CsvQuote(raw_cells_ ? text : NeutraliseCell(text)); };
  if (!out_) {
    // The rename at Close would put the rejects in place of the input.
    std::error_code ec;
    if (std::filesystem::equivalent(path_, input_, ec))
      return BadInput(path_, "the reject file is the file being imported",
                      "name another file with --rejects (the default is FILE.rejects.csv)");
    auto file = SafeFile::Create(path_);
    if (!file.ok())
      return BadInput(path_, "cannot write the reject file", "check that the folder is writable");
    out_ = std::move(file.value());
    std::ostream& out = out_->out();
    out << "reject_line,reject_reason";
    for (const auto& h : header_)
      if (!IsRejectColumn(h)) out << ',' << cell(h);
    out << "\r\n";
  }
  std::ostream& out = out_->out();
  out << line << ',' << cell(reason);
  for (size_t i = 0; i < fields.size(); ++i)
    if (i >= header_.size() || !IsRejectColumn(header_[i])) out << ',' << cell(fields[i]);
  out << "\r\n";
  ++rows_;
  if (!out) return BadInput(path_, "cannot write the reject file", "check that the folder is writable");
  return {};
}

Status RejectWriter::Close() {
  if (!out_) return {};
  Status s = out_->Commit();
  if (!s.ok()) return BadInput(path_, "cannot write the reject file", "check that the folder is writable");
  return {};
}

Result<RowImportEnd> FinishRowImport(Store& store, int64_t seq, const std::string& kind, const std::string& sha,
                                     const std::string& path, int64_t data_rows, int64_t rows_landed,
                                     const std::string& row_noun, Progress* shown, RejectWriter& rejects) {
  if (data_rows == 0)
    return BadInput(path + ":2", "the file has no data rows", "add one row per " + row_noun + " under the header");
  if (shown) {
    shown->Update(FileSize(path));
    shown->Finish();
  }
  Status closed = rejects.Close();
  if (!closed.ok()) return closed.error();
  RowImportEnd end;
  end.rows_rejected = rejects.rows();
  if (end.rows_rejected) end.reject_path = rejects.path();
  RecordImportFile(store, seq, kind, sha, path, rows_landed, end.rows_rejected);
  return end;
}

}  // namespace twinprobe
