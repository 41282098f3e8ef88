// Streaming reader for delimited text. The file is read in large blocks; a record is split in
// place when it has no quotes (the common case) and copied only when RFC 4180 quoting needs it.
#include "contrasta/read.hpp"

#include <sys/mman.h>

#include <algorithm>
#include <cstring>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>
#include <string_view>
#include <cmath>
#include <unordered_map>

#include "contrasta/decimal.hpp"
#include "contrasta/error.hpp"
#include "decimal_plain.hpp"

namespace contrasta {
namespace {

constexpr std::size_t block_size = 1 << 20;

class record_reader {
 public:
  record_reader(std::istream& in, std::string source) : in_(in), source_(std::move(source)) {
    buffer_.resize(block_size);
  }

  // The next record as fields; false at the end of input. Views stay valid until the next call.
  bool next(std::vector<std::string_view>& fields, char delimiter) {
    fields.clear();
    if (scan_plain_line(fields, delimiter)) return true;
    fields.clear();
    std::string_view line;
    if (!next_line(line)) return false;
    record_line_ = line_number_;
    if (split_plain(line, delimiter, fields)) return true;
    fields.clear();
    split_quoted(line, delimiter, fields);
    return true;
  }

  // Reads the header line raw (for delimiter detection); strips a UTF-8 byte order mark.
  bool peek_header(std::string& header) {
    std::string_view line;
    if (!next_line(line)) return false;
    if (line.size() >= 3 && std::memcmp(line.data(), "\xEF\xBB\xBF", 3) == 0) line.remove_prefix(3);
    header.assign(line);
    record_line_ = line_number_;
    return true;
  }

  std::uint64_t line() const { return record_line_; }
  const std::string& source() const { return source_; }

 private:
  bool next_line(std::string_view& line) {
    for (;;) {
      const char* start = buffer_.data() + pos_;
      const void* nl = std::memchr(start, '\n', end_ - pos_);
      if (nl != nullptr) {
        std::size_t len = static_cast<const char*>(nl) - start;
        line = std::string_view(start, len);
        pos_ += len + 1;
        ++line_number_;
        if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
        return true;
      }
      if (eof_) {
        if (pos_ == end_) return false;
        line = std::string_view(start, end_ - pos_);
        pos_ = end_;
        ++line_number_;
        if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
        return true;
      }
      refill();
    }
  }

  void refill() {
    std::size_t remaining = end_ - pos_;
    if (pos_ > 0) {
      std::memmove(buffer_.data(), buffer_.data() + pos_, remaining);
      pos_ = 0;
      end_ = remaining;
    }
    if (end_ == buffer_.size()) buffer_.resize(buffer_.size() * 2);  // a very long line
    in_.read(buffer_.data() + end_, static_cast<std::streamsize>(buffer_.size() - end_));
    std::streamsize got = in_.gcount();
    end_ += static_cast<std::size_t>(got);
    if (got == 0 || !in_) eof_ = in_.eof() || got == 0;
    if (in_.bad()) throw input_error("cannot read " + source_ + ": read error");
  }

  // The common record, a line without quotes whose end is already in the buffer, split while
  // its end is sought: one pass over the bytes instead of a library search for the line end and
  // a second pass for the delimiters (data lines are short, so the calls cost more than the
  // bytes). Gives the fields next_line + split_plain would; false, consuming nothing, otherwise.
  bool scan_plain_line(std::vector<std::string_view>& fields, char delimiter) {
    if (delimiter == '\r' || delimiter == '\n' || delimiter == '"') return false;
    const char* const start = buffer_.data() + pos_;
    const char* const stop = buffer_.data() + end_;
    const char* field = start;
    for (const char* c = start; c != stop; ++c) {
      if (*c == '\n') {
        // next_line drops one '\r' before the line break.
        const char* field_end = c > start && c[-1] == '\r' ? c - 1 : c;
        fields.emplace_back(field, static_cast<std::size_t>(field_end - field));
        pos_ = static_cast<std::size_t>(c + 1 - buffer_.data());
        record_line_ = ++line_number_;
        return true;
      }
      if (*c == delimiter) {
        fields.emplace_back(field, static_cast<std::size_t>(c - field));
        field = c + 1;
      } else if (*c == '"') {
        return false;
      }
    }
    return false;
  }

  // Splits a line without quotes in one pass over its bytes (data lines are short, so one loop
  // beats a library search per field); false, with nothing promised about `fields`, when the
  // line holds a quote and needs split_quoted.
  static bool split_plain(std::string_view line, char delimiter, std::vector<std::string_view>& fields) {
    const char* start = line.data();
    const char* const end = start + line.size();
    for (const char* c = start; c != end; ++c) {
      if (*c == delimiter) {
        fields.emplace_back(start, static_cast<std::size_t>(c - start));
        start = c + 1;
      } else if (*c == '"') {
        return false;
      }
    }
    fields.emplace_back(start, static_cast<std::size_t>(end - start));
    return true;
  }

  // RFC 4180: a field may be quoted; "" inside a quoted field is one quote; a quoted field may
  // contain delimiters and line breaks.
  void split_quoted(std::string_view line, char delimiter, std::vector<std::string_view>& fields) {
    owned_.clear();
    std::string current;
    bool quoted = false, was_quoted = false;
    std::size_t i = 0;
    std::string text(line);
    for (;;) {
      if (i >= text.size()) {
        if (quoted) {
          std::string_view more;
          if (!next_line(more))
            throw input_error(source_ + " line " + std::to_string(record_line_) +
                              ": a quoted field is not closed before the end of the file; add the closing quote");
          text += '\n';
          text.append(more);
          continue;
        }
        owned_.push_back(std::move(current));
        break;
      }
      char c = text[i++];
      if (quoted) {
        if (c == '"') {
          if (i < text.size() && text[i] == '"') {
            current += '"';
            ++i;
          } else {
            quoted = false;
          }
        } else {
          current += c;
        }
      } else if (c == '"' && (current.empty() && !was_quoted)) {
        quoted = was_quoted = true;
      } else if (c == delimiter) {
        owned_.push_back(std::move(current));
        current.clear();
        was_quoted = false;
      } else {
        current += c;
      }
    }
    for (const auto& f : owned_) fields.emplace_back(f);
  }

  std::istream& in_;
  std::string source_;
  std::vector<char> buffer_;
  std::size_t pos_ = 0, end_ = 0;
  bool eof_ = false;
  std::uint64_t line_number_ = 0, record_line_ = 0;
  std::vector<std::string> owned_;
};

char detect_delimiter(const std::string& header) {
  std::size_t commas = 0, tabs = 0, semicolons = 0;
  bool quoted = false;
  for (char c : header) {
    if (c == '"') quoted = !quoted;
    if (quoted) continue;
    commas += c == ',';
    tabs += c == '\t';
    semicolons += c == ';';
  }
  if (tabs > 0 && tabs >= commas && tabs >= semicolons) return '\t';
  if (semicolons > 0 && semicolons >= commas) return ';';
  return ',';
}

std::string trim(std::string_view s) {
  std::size_t a = 0, b = s.size();
  while (a < b && (s[a] == ' ' || s[a] == '\t')) ++a;
  while (b > a && (s[b - 1] == ' ' || s[b - 1] == '\t')) --b;
  return std::string(s.substr(a, b - a));
}

bool valid_utf8(std::string_view s) {
  std::size_t i = 0;
  while (i < s.size()) {
    unsigned char c = static_cast<unsigned char>(s[i]);
    std::size_t len = c < 0x80 ? 1 : (c >> 5) == 0x6 ? 2 : (c >> 4) == 0xE ? 3 : (c >> 3) == 0x1E ? 4 : 0;
    if (len == 0 || i + len > s.size()) return false;
    for (std::size_t j = 1; j < len; ++j)
      if ((static_cast<unsigned char>(s[i + j]) >> 6) != 0x2) return false;
    if (len == 2 && c < 0xC2) return false;  // overlong
    i += len;
  }
  return true;
}

std::string quote_for_message(std::string_view s) {
  std::string out = "\"";
  std::size_t shown = 0;
  for (char c : s) {
    if (shown++ == 40) {
      out += "...";
      break;
    }
    unsigned char u = static_cast<unsigned char>(c);
    if (u < 0x20 || u == 0x7F) {
      static const char hex[] = "0123456789abcdef";
      out += "\\x";
      out += hex[u >> 4];
      out += hex[u & 15];
    } else {
      out += c;
    }
  }
  return out + "\"";
}

// Observations of one level for one response, kept in blocks that grow geometrically (256
// values, doubling up to 65536) so that memory grows without reallocation copies, thousands of
// small responses stay small, and blocks are released one by one while the dataset is assembled.
// Large blocks are mapped directly from the system so that releasing one returns its memory at
// once (heap chunks above malloc's adaptive threshold may stay resident after free).
template <class T>
struct mapped_block {
  T* data = nullptr;
  std::size_t size = 0;
  bool mapped = false;
  explicit mapped_block(std::size_t n) : size(n) {
    std::size_t bytes = n * sizeof(T);
    if (bytes >= (1u << 18)) {
      // Populated at once: the block is about to be filled, and one call beats a page fault per
      // 4 KiB page.
      void* p = ::mmap(nullptr, bytes, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS | MAP_POPULATE, -1, 0);
      if (p == MAP_FAILED) throw std::bad_alloc();
      data = static_cast<T*>(p);
      mapped = true;
    } else {
      data = new T[n];
    }
  }
  mapped_block(const mapped_block&) = delete;
  mapped_block& operator=(const mapped_block&) = delete;
  ~mapped_block() { reset(); }
  void reset() {
    if (!data) return;
    if (mapped) ::munmap(data, size * sizeof(T));
    else delete[] data;
    data = nullptr;
  }
  T* get() const { return data; }
  T& operator[](std::size_t i) const { return data[i]; }
};

struct level_store {
  static constexpr std::size_t first_block = 256, largest_block = 1 << 16;
  std::vector<std::unique_ptr<mapped_block<double>>> value_blocks;
  std::vector<std::unique_ptr<mapped_block<std::uint64_t>>> row_blocks;
  std::vector<std::size_t> block_sizes;
  std::size_t count = 0, in_last = 0;
  std::size_t missing = 0;
  // Where the next value goes: kept here so that adding a value touches this struct and the
  // block only (thousands of responses write one value each per row).
  double* next_value = nullptr;
  std::uint64_t* next_row = nullptr;
  std::size_t room = 0;
  void add(double v, std::uint64_t row) {
    if (room == 0) grow();
    *next_value++ = v;
    *next_row++ = row;
    --room;
    ++in_last;
    ++count;
  }
  void grow() {
    std::size_t size = block_sizes.empty() ? first_block : std::min(block_sizes.back() * 2, largest_block);
    value_blocks.push_back(std::make_unique<mapped_block<double>>(size));
    row_blocks.push_back(std::make_unique<mapped_block<std::uint64_t>>(size));
    block_sizes.push_back(size);
    in_last = 0;
    next_value = value_blocks.back()->get();
    next_row = row_blocks.back()->get();
    room = size;
  }
  std::size_t used(std::size_t block) const { return block + 1 == block_sizes.size() ? in_last : block_sizes[block]; }
};

struct transparent_hash {
  using is_transparent = void;
  std::size_t operator()(std::string_view s) const { return std::hash<std::string_view>{}(s); }
};

struct response_state {
  std::string name;
  std::size_t column = 0;
  bool have_reference = false;
  decimal reference;
  detail::plain_reference plain;  // the reference for the fast path (unusable until it is set)
  std::string reference_text;
  std::vector<level_store> stores;  // per level
  bool failed = false;               // all-numeric: a non-numeric value seen, column dropped
};

class long_reader {
 public:
  long_reader(record_reader& records, const read_request& request, char delimiter)
      : records_(records), request_(request), delimiter_(delimiter), point_(request.decimal_comma ? ',' : '.') {
    for (const auto& token : request.missing_tokens)
      if (parse_decimal(token, request.decimal_comma)) numeric_missing_ = true;
  }

  std::vector<dataset> run(const std::vector<std::string>& header) {
    header_ = header;
    std::vector<std::string_view> fields;
    bool have_first = records_.next(fields, delimiter_);
    while (have_first && fields.size() == 1 && trim(fields[0]).empty()) have_first = records_.next(fields, delimiter_);
    if (!have_first)
      throw input_error(records_.source() + " has a header line but no data rows; add one row per observation");
    choose_columns(fields);
    for (const auto& level : request_.levels) level_index(level, true);
    restricted_ = !request_.levels.empty();
    do {
      if (fields.size() == 1 && trim(fields[0]).empty()) continue;  // blank line
      take(fields);
    } while (records_.next(fields, delimiter_));
    return assemble();
  }

 private:
  [[noreturn]] void fail_at(std::size_t column, const std::string& what) {
    throw input_error(records_.source() + " line " + std::to_string(records_.line()) + ", column " +
                      std::to_string(column + 1) + " (" + header_[column] + "): " + what);
  }

  std::size_t column_named(const std::string& name, const char* option) {
    for (std::size_t i = 0; i < header_.size(); ++i)
      if (header_[i] == name) return i;
    throw input_error(records_.source() + ": no column named '" + name + "' (given in " + option +
                      "); the columns are: " + column_list());
  }

  std::string column_list() {
    std::string out;
    for (std::size_t i = 0; i < header_.size(); ++i) {
      if (i) out += ", ";
      out += "'" + header_[i] + "'";
      if (i < numeric_hint_.size() && numeric_hint_[i]) out += " (numeric)";
    }
    return out;
  }

  void choose_columns(const std::vector<std::string_view>& first) {
    numeric_hint_.assign(header_.size(), false);
    for (std::size_t i = 0; i < header_.size() && i < first.size(); ++i)
      numeric_hint_[i] = parse_decimal(first[i], request_.decimal_comma).has_value();
    if (request_.group_column.empty() && request_.response_columns.empty()) {
      if (header_.size() != 2)
        throw input_error(records_.source() + " has " + std::to_string(header_.size()) +
                          " columns; name the factor with --group and the response with --response. Columns: " +
                          column_list());
      group_ = 0;
      add_response(1);
      return;
    }
    if (request_.group_column.empty()) {
      if (header_.size() == 2) {
        group_ = 0;
      } else {
        throw input_error(records_.source() + ": name the factor column with --group; columns: " + column_list());
      }
    } else {
      group_ = column_named(request_.group_column, "--group");
    }
    if (request_.response_columns.empty()) {
      if (header_.size() != 2)
        throw input_error(records_.source() + ": name the response column with --response; columns: " + column_list());
      add_response(group_ == 0 ? 1 : 0);
      return;
    }
    if (request_.response_columns.size() == 1 && request_.response_columns[0] == "all-numeric") {
      all_numeric_ = true;
      for (std::size_t i = 0; i < header_.size(); ++i)
        if (i != group_ && numeric_hint_[i]) add_response(i);
      if (responses_.empty())
        throw input_error(records_.source() + ": --response all-numeric found no numeric column besides the factor; columns: " +
                          column_list());
      return;
    }
    for (const auto& name : request_.response_columns) {
      std::size_t c = column_named(name, "--response");
      if (c == group_)
        throw input_error("column '" + name + "' is both the factor (--group) and a response (--response); choose different columns");
      add_response(c);
    }
  }

  void add_response(std::size_t column) {
    response_state r;
    r.name = header_[column];
    r.column = column;
    responses_.push_back(std::move(r));
  }

  // A name of up to 7 bytes packed into an integer, with the length in the top byte, so that
  // short names (most level names: T1, control, 40) compare as one integer; 0 for longer names.
  static std::uint64_t short_key(std::string_view name) {
    if (name.size() > 7) return 0;
    std::uint64_t key = static_cast<std::uint64_t>(name.size()) << 56;
    for (std::size_t i = 0; i < name.size(); ++i) key |= static_cast<std::uint64_t>(static_cast<unsigned char>(name[i])) << (8 * i);
    return key;
  }

  std::size_t level_index(std::string_view name, bool create) {
    if (levels_.size() <= 16) {
      // A few levels with short names: compare the packed names, all of them, without an early
      // exit (the level of the next row is unpredictable, so a branch on the match would
      // mispredict about once a row).
      const std::uint64_t key = short_key(name);
      if (key != 0) {
        std::size_t found = npos;
        for (std::size_t i = 0; i < short_keys_.size(); ++i) found = short_keys_[i] == key ? i : found;
        if (found != npos) return found;
      }
    }
    return level_index_slow(name, create);
  }

  // Long names, many levels, and new levels.
  [[gnu::noinline]] std::size_t level_index_slow(std::string_view name, bool create) {
    if (levels_.size() <= 16) {
      if (short_key(name) == 0) {
        if (last_level_ != npos && name == levels_[last_level_]) return last_level_;
        // A few levels: comparing the names beats hashing.
        for (std::size_t i = 0; i < levels_.size(); ++i)
          if (levels_[i].size() == name.size() && levels_[i] == name) return last_level_ = i;
      }
    } else if (last_level_ != npos && name == levels_[last_level_]) {
      return last_level_;
    }
    auto it = levels_.size() <= 16 ? level_map_.end() : level_map_.find(name);
    std::size_t index;
    if (it != level_map_.end()) {
      index = it->second;
    } else {
      if (!create) return npos;
      if (!valid_utf8(name)) fail_at(group_, "the level name is not valid UTF-8; save the file as UTF-8");
      index = levels_.size();
      levels_.emplace_back(name);
      short_keys_.push_back(short_key(name));
      level_map_.emplace(std::string(name), index);
      for (auto& r : responses_) r.stores.emplace_back();
    }
    last_level_ = index;
    return index;
  }

  bool is_missing(std::string_view field) const {
    while (!field.empty() && (field.front() == ' ' || field.front() == '\t')) field.remove_prefix(1);
    while (!field.empty() && (field.back() == ' ' || field.back() == '\t')) field.remove_suffix(1);
    for (const auto& token : request_.missing_tokens)
      if (field == token) return true;
    return false;
  }

  void take(const std::vector<std::string_view>& fields) {
    if (fields.size() != header_.size())
      throw input_error(records_.source() + " line " + std::to_string(records_.line()) + ": " +
                        std::to_string(fields.size()) + " fields where the header has " +
                        std::to_string(header_.size()) + "; check the delimiter (use --delimiter) and quoting");
    std::string_view group = fields[group_];
    if (group.size() > 0 && (group.front() == ' ' || group.back() == ' ')) {
      trimmed_group_ = trim(group);
      group = trimmed_group_;
    }
    if (group.empty()) fail_at(group_, "the level is empty; every row needs a level name");
    std::size_t level = level_index(group, !restricted_);
    if (level == npos) return;  // not one of --levels
    for (auto& r : responses_) {
      if (r.failed) continue;
      std::string_view field = fields[r.column];
      // The common row once the reference is known: a plain number that cannot be a missing
      // token, centred in 64-bit integers. Exactly what the general path below would store.
      if (!numeric_missing_) {
        double centred;
        if (detail::centre_plain_text(field, point_, r.plain, centred)) {
          r.stores[level].add(centred, records_.line());
          continue;
        }
      }
      // Parse first: a number is missing only when a missing token is itself numeric (-99).
      // A plain decimal is parsed in place (no optional to copy: a 16-byte copy of the mantissa
      // just written as two halves stalls store forwarding, once per row).
      decimal value;
      bool parsed = detail::parse_plain(field, point_, value);
      if (!parsed) {
        if (auto general = parse_decimal(field, request_.decimal_comma)) {
          value = *general;
          parsed = true;
        }
      }
      if ((!parsed || numeric_missing_) && is_missing(field)) {
        ++r.stores[level].missing;
        continue;
      }
      if (!parsed) {
        if (all_numeric_) {
          r.failed = true;
          continue;
        }
        std::string t = trim(field);
        std::string lower;
        for (char c : t) lower += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
        if (lower == "inf" || lower == "-inf" || lower == "+inf" || lower == "infinity" || lower == "-infinity")
          fail_at(r.column, quote_for_message(field) + " is infinite; infinite values cannot be analysed, remove or correct it");
        if (!request_.decimal_comma && parse_decimal(field, true))
          fail_at(r.column, quote_for_message(field) + " is not a number; if the file uses decimal commas, add --decimal-comma");
        fail_at(r.column, quote_for_message(field) + " is not a number; correct it, or declare it missing with --missing");
      }
      if (!(value.exact && value.exponent <= 0) && !std::isfinite(to_double(value)))
        fail_at(r.column, quote_for_message(field) + " is too large for double precision; rescale the response");
      if (!r.have_reference) {
        r.have_reference = true;
        r.reference = value;
        r.reference_text = trim(field);
        r.plain = detail::plain_reference_of(value);
      }
      double centred;
      if (!detail::centred_plain(value, r.reference, centred)) centred = centred_difference(value, r.reference);
      r.stores[level].add(centred, records_.line());
    }
  }

  std::vector<dataset> assemble() {
    std::vector<dataset> out;
    for (auto& r : responses_) {
      if (r.failed) continue;
      dataset d;
      d.source = records_.source();
      d.group_column = header_[group_];
      d.response = r.name;
      d.levels = levels_;
      d.centre = r.have_reference ? to_double(r.reference) : 0.0;
      d.centre_text = r.have_reference ? r.reference_text : "0";
      std::size_t total = 0;
      for (auto& s : r.stores) total += s.count;
      // reserve() does not touch the pages; they fill as the blocks are released, so the peak stays
      // near one copy of the data.
      d.values.reserve(total);
      d.rows.reserve(total);
      d.offsets.push_back(0);
      std::size_t at = 0;
      for (auto& s : r.stores) {
        for (std::size_t b = 0; b < s.value_blocks.size(); ++b) {
          std::size_t len = s.used(b);
          d.values.insert(d.values.end(), s.value_blocks[b]->get(), s.value_blocks[b]->get() + len);
          d.rows.insert(d.rows.end(), s.row_blocks[b]->get(), s.row_blocks[b]->get() + len);
          s.value_blocks[b].reset();
          s.row_blocks[b].reset();
          at += len;
        }
        d.offsets.push_back(at);
        d.missing.push_back(s.missing);
      }
      out.push_back(std::move(d));
    }
    return out;
  }

  static constexpr std::size_t npos = static_cast<std::size_t>(-1);
  record_reader& records_;
  const read_request& request_;
  char delimiter_;
  char point_;  // the decimal point of the response columns
  std::vector<std::string> header_;
  std::vector<bool> numeric_hint_;
  std::size_t group_ = 0;
  bool all_numeric_ = false, restricted_ = false, numeric_missing_ = false;
  std::vector<response_state> responses_;
  std::vector<std::string> levels_;
  std::vector<std::uint64_t> short_keys_;  // short_key of each level, 0 for long names
  std::unordered_map<std::string, std::size_t, transparent_hash, std::equal_to<>> level_map_;
  std::size_t last_level_ = npos;
  std::string trimmed_group_;
};

// Wide layout: one column per level, one observation per cell.
dataset read_wide(record_reader& records, const read_request& request, char delimiter,
                  const std::vector<std::string>& header) {
  const std::size_t k = header.size();
  std::vector<std::vector<double>> values(k);
  std::vector<std::vector<std::uint64_t>> rows(k);
  std::vector<std::size_t> missing(k, 0), blanks_pending(k, 0);
  bool have_reference = false;
  decimal reference;
  std::string reference_text;
  std::vector<std::string_view> fields;
  while (records.next(fields, delimiter)) {
    if (fields.size() == 1 && trim(fields[0]).empty()) continue;
    if (fields.size() > k)
      throw input_error(records.source() + " line " + std::to_string(records.line()) + ": " +
                        std::to_string(fields.size()) + " fields where the header names " + std::to_string(k) +
                        " levels; check the delimiter (use --delimiter)");
    for (std::size_t i = 0; i < k; ++i) {
      std::string t = i < fields.size() ? trim(fields[i]) : std::string();
      if (t.empty()) {
        ++blanks_pending[i];  // a blank counts as missing only when a value follows below it
        continue;
      }
      bool is_missing = std::find(request.missing_tokens.begin(), request.missing_tokens.end(), t) !=
                        request.missing_tokens.end();
      if (is_missing) {
        missing[i] += blanks_pending[i] + 1;
        blanks_pending[i] = 0;
        continue;
      }
      auto d = parse_decimal(t, request.decimal_comma);
      if (!d || !std::isfinite(to_double(*d)))
        throw input_error(records.source() + " line " + std::to_string(records.line()) + ", column " +
                          std::to_string(i + 1) + " (" + header[i] + "): " + quote_for_message(t) +
                          " is not a finite number; correct it, or declare it missing with --missing");
      missing[i] += blanks_pending[i];
      blanks_pending[i] = 0;
      if (!have_reference) {
        have_reference = true;
        reference = *d;
        reference_text = t;
      }
      values[i].push_back(centred_difference(*d, reference));
      rows[i].push_back(records.line());
    }
  }
  dataset d;
  d.source = records.source();
  d.response = "value";
  d.centre = have_reference ? to_double(reference) : 0.0;
  d.centre_text = have_reference ? reference_text : "0";
  d.offsets.push_back(0);
  std::vector<std::size_t> order;
  if (request.levels.empty()) {
    for (std::size_t i = 0; i < k; ++i) order.push_back(i);
  } else {
    for (const auto& name : request.levels) {
      auto it = std::find(header.begin(), header.end(), name);
      if (it == header.end())
        throw input_error(records.source() + ": --levels names '" + name + "', which is not a column of the wide file");
      order.push_back(static_cast<std::size_t>(it - header.begin()));
    }
  }
  for (std::size_t i : order) {
    if (header[i].empty()) continue;
    d.levels.push_back(header[i]);
    d.values.insert(d.values.end(), values[i].begin(), values[i].end());
    d.rows.insert(d.rows.end(), rows[i].begin(), rows[i].end());
    d.offsets.push_back(d.values.size());
    d.missing.push_back(missing[i]);
  }
  if (d.values.empty()) throw input_error(records.source() + " has no numeric cells below its header");
  return d;
}

}  // namespace

std::vector<dataset> read_datasets(std::istream& in, const std::string& source, const read_request& request) {
  record_reader records(in, source);
  std::string header_text;
  if (!records.peek_header(header_text) || header_text.find_first_not_of(" \t") == std::string::npos)
    throw input_error(source + " is empty; it needs a header line naming the columns, then one row per observation");
  if (!valid_utf8(header_text)) throw input_error(source + " line 1: the header is not valid UTF-8; save the file as UTF-8");
  char delimiter = request.delimiter ? *request.delimiter : detect_delimiter(header_text);
  std::vector<std::string_view> header_fields;
  {
    // Re-split the header with the quoting rules of a record.
    std::istringstream header_stream(header_text);
    record_reader header_reader(header_stream, source);
    header_reader.next(header_fields, delimiter);
    std::vector<std::string> header;
    for (auto f : header_fields) header.push_back(trim(f));
    std::unordered_map<std::string_view, std::size_t> seen;  // thousands of responses: no pairwise scan
    for (const auto& name : header)
      if (!name.empty() && seen[name]++ > 0)
        throw input_error(source + " line 1: two columns are named '" + name + "'; give every column its own name");
    if (request.wide) return {read_wide(records, request, delimiter, header)};
    if (header.size() < 2)
      throw input_error(source + " line 1: found one column ('" + (header.empty() ? "" : header[0]) +
                        "'); a long-format file needs a factor column and a response column (check --delimiter, or use --wide)");
    long_reader reader(records, request, delimiter);
    return reader.run(header);
  }
}

std::vector<dataset> read_datasets(const read_request& request) {
  if (request.path == "-") return read_datasets(std::cin, "-", request);
  std::ifstream file(request.path, std::ios::binary);
  if (!file) throw input_error("cannot open '" + request.path + "'; check the path and permissions");
  return read_datasets(file, request.path, request);
}

}  // namespace contrasta
