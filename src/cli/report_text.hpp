// Text helpers shared by the report writers (HTML, SVG, Markdown, terminal agreement table):
// escaping of user data for each output language and the display form of numbers. Nothing here
// computes a statistic; numbers arrive finished and are only rounded for display.
#pragma once
#include <string>
#include <string_view>

namespace contrasta::cli {

// Escapes & < > " ' so that text is safe both as element content and inside a quoted
// attribute, in HTML and in SVG/XML alike. Level names, column names and file names are user
// data and always pass through here.
std::string xml_escape(std::string_view text);

// Escapes text for a Markdown table cell or paragraph: HTML-significant characters become
// entities (Markdown renderers pass raw HTML through), and | \ ` * _ [ ] < > # are neutralised
// so that a level name can neither end a table cell nor start a link or emphasis.
std::string markdown_text(std::string_view text);

// A number rounded for reading: `significant` digits, plain notation from 1e-4 to 1e6 and
// scientific notation (1.235e+07) outside; "n/a" for NaN; "inf" / "-inf" for infinities.
std::string display_number(double value, int significant = 4);

// A p-value for reading: three significant digits, "< 0.0001" below 1e-4, "n/a" for NaN.
std::string display_p(double p);

// A setting or an exact quantity in its shortest form: up to `significant` digits, trailing
// zeros dropped (0.05, 95, -1, 0.3333, 14).
std::string plain_number(double value, int significant = 4);

// Degrees of freedom: whole numbers as integers (14), fractional ones (Welch) to 4 digits.
std::string display_df(double df);

// A percentage from a proportion: 0.95 -> "95%".
std::string percent_text(double proportion);

// The published name of an adjustment from its option name: holm -> Holm, bh ->
// Benjamini-Hochberg. Unknown names come back as they are.
std::string adjustment_words(const std::string& name);

// A whole count with thousands separated by commas: 99999 -> "99,999".
std::string count_text(double count);

// A number with a fixed count of decimals (tick labels, where a column of labels must line up).
std::string fixed_decimals(double value, int decimals);

// Percent-encodes a relative file name for a link target: unreserved characters of RFC 3986
// (letters, digits, - . _ ~) stay, every other byte becomes %XX.
std::string percent_encode(std::string_view name);

// Quotes one argument for a POSIX shell when it needs quoting (the reproducing command).
std::string shell_quote(std::string_view argument);

}  // namespace contrasta::cli
