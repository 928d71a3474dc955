// Lint: no SQL is built from strings with user data, and no SQL leaves storage/ (DEVELOPERS.md,
// "Where things go"; storage/Database.h: "every value goes through Statement::bind").
//
// A small C++ tokenizer (comments, preprocessor lines, string and raw-string literals, numbers
// with digit separators) reads the sources under HUMWISE_SOURCE_DIR, deterministically, and:
//  1. in storage/: every call that takes SQL text - prepare(...), cached(...), execute(...),
//     rows(...) (storage/Backup.cpp), sqlite3_prepare_v2/v3(...), sqlite3_exec(...) - must not
//     concatenate or stream anything into its arguments (`+`, `+=`, `<<`); and a literal that
//     starts like an SQL statement (SELECT, INSERT, UPDATE, DELETE, CREATE, PRAGMA, ...) must not
//     be concatenated or streamed with anything, nor hold a printf/std::format placeholder,
//     wherever it stands (this catches `std::string sql = "SELECT ..." + name; db.prepare(sql);`).
//     The one documented exception: storage/Schema.cpp sets PRAGMA user_version (which takes no
//     bound parameter) from the migration loop's own integer.
//  2. outside storage/ (app/, core/, sample_fleet/): no sqlite3 identifier or header, and no
//     string literal holding "SELECT ", "INSERT ", "UPDATE ", "DELETE FROM" or "PRAGMA ".
// The scanner is checked first on snippets that must and must not be reported.
#include <gtest/gtest.h>

#include <algorithm>
#include <array>
#include <cctype>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <string>
#include <string_view>
#include <vector>

namespace humwise::lint {
namespace {

namespace fs = std::filesystem;

struct Token {
    enum class Kind { Identifier, Literal, Number, Punct };
    Kind kind;
    std::string text; // literal: its content between the quotes (raw strings: between the parentheses)
    std::size_t line;
};

bool identStart(char c) { return std::isalpha(static_cast<unsigned char>(c)) || c == '_'; }
bool identChar(char c) { return std::isalnum(static_cast<unsigned char>(c)) || c == '_'; }

std::vector<Token> tokenize(std::string_view s) {
    std::vector<Token> out;
    std::size_t i = 0, line = 1;
    bool lineStart = true; // only blanks so far on this line (for preprocessor directives)
    const auto advance = [&](std::size_t n) {
        for (std::size_t k = 0; k < n && i < s.size(); ++k, ++i)
            if (s[i] == '\n') line++;
    };
    while (i < s.size()) {
        const char c = s[i];
        if (c == '\n') {
            lineStart = true;
            advance(1);
            continue;
        }
        if (std::isspace(static_cast<unsigned char>(c))) {
            advance(1);
            continue;
        }
        if (lineStart && c == '#') { // a directive, with its continuation lines
            while (i < s.size() && s[i] != '\n') advance(s[i] == '\\' && i + 1 < s.size() ? 2 : 1);
            continue;
        }
        lineStart = false;
        if (s.substr(i, 2) == "//") {
            while (i < s.size() && s[i] != '\n') advance(1);
            continue;
        }
        if (s.substr(i, 2) == "/*") {
            const auto end = s.find("*/", i + 2);
            advance(end == std::string_view::npos ? s.size() - i : end + 2 - i);
            continue;
        }
        // String literals, with an optional encoding prefix and R for raw strings.
        std::size_t p = i;
        while (p < s.size() && p - i < 3 && (s[p] == 'u' || s[p] == 'U' || s[p] == 'L' || s[p] == '8')) ++p;
        const bool raw = p < s.size() && s[p] == 'R' && p + 1 < s.size() && s[p + 1] == '"';
        if (raw || (p < s.size() && s[p] == '"' && (p == i || !identChar(s[i]) || std::string_view("uUL8").find(s[i]) != std::string_view::npos))) {
            const std::size_t startLine = line;
            if (raw) {
                const std::size_t open = std::min(s.find('(', p + 2), s.size() - 1);
                std::string delim(1, ')');
                delim += s.substr(p + 2, open - p - 2);
                delim += '"';
                const std::size_t close = s.find(delim, open);
                const std::size_t stop = close == std::string_view::npos ? s.size() : close;
                out.push_back({Token::Kind::Literal, std::string(s.substr(open + 1, stop - open - 1)), startLine});
                advance(stop + delim.size() - i);
            } else {
                std::size_t q = p + 1;
                while (q < s.size() && s[q] != '"' && s[q] != '\n') q += s[q] == '\\' ? 2 : 1;
                out.push_back({Token::Kind::Literal, std::string(s.substr(p + 1, q - p - 1)), startLine});
                advance(q + 1 - i);
            }
            continue;
        }
        if (identStart(c)) {
            std::size_t q = i;
            while (q < s.size() && identChar(s[q])) ++q;
            out.push_back({Token::Kind::Identifier, std::string(s.substr(i, q - i)), line});
            advance(q - i);
            continue;
        }
        if (std::isdigit(static_cast<unsigned char>(c)) || (c == '.' && i + 1 < s.size() && std::isdigit(static_cast<unsigned char>(s[i + 1])))) {
            std::size_t q = i;
            while (q < s.size() && (identChar(s[q]) || s[q] == '.' || s[q] == '\'' ||
                                    ((s[q] == '+' || s[q] == '-') && q > i && (s[q - 1] == 'e' || s[q - 1] == 'E' || s[q - 1] == 'p' || s[q - 1] == 'P'))))
                ++q;
            out.push_back({Token::Kind::Number, std::string(s.substr(i, q - i)), line});
            advance(q - i);
            continue;
        }
        if (c == '\'') { // character literal
            std::size_t q = i + 1;
            while (q < s.size() && s[q] != '\'' && s[q] != '\n') q += s[q] == '\\' ? 2 : 1;
            out.push_back({Token::Kind::Number, std::string(s.substr(i, q + 1 - i)), line});
            advance(q + 1 - i);
            continue;
        }
        static constexpr std::array<std::string_view, 8> twoChar{"+=", "<<", "::", "->", "++", "==", "!=", "&&"};
        const auto two = s.substr(i, 2);
        const bool isTwo = std::find(twoChar.begin(), twoChar.end(), two) != twoChar.end();
        out.push_back({Token::Kind::Punct, std::string(s.substr(i, isTwo ? 2 : 1)), line});
        advance(isTwo ? 2 : 1);
    }
    return out;
}

struct Finding {
    std::string file;
    std::size_t line;
    std::string what;
};

bool isPunct(const Token& t, std::string_view p) { return t.kind == Token::Kind::Punct && t.text == p; }
bool joins(const Token& t) { return isPunct(t, "+") || isPunct(t, "+=") || isPunct(t, "<<"); }

// Does the literal start like an SQL statement (after blanks and \n or \t escapes)?
bool startsLikeSql(std::string_view text) {
    std::size_t i = 0;
    while (i < text.size()) {
        if (std::isspace(static_cast<unsigned char>(text[i]))) ++i;
        else if (text[i] == '\\' && i + 1 < text.size() && (text[i + 1] == 'n' || text[i + 1] == 't')) i += 2;
        else break;
    }
    std::size_t j = i;
    while (j < text.size() && std::isupper(static_cast<unsigned char>(text[j]))) ++j;
    static const std::array<std::string_view, 14> keywords{"SELECT", "INSERT", "UPDATE", "DELETE", "CREATE", "DROP", "ALTER",
                                                           "PRAGMA", "REPLACE", "WITH", "BEGIN", "COMMIT", "ROLLBACK", "VACUUM"};
    const auto word = text.substr(i, j - i);
    return (j == text.size() || !std::isalnum(static_cast<unsigned char>(text[j]))) &&
           std::find(keywords.begin(), keywords.end(), word) != keywords.end();
}

// The exception: storage/Schema.cpp, `"PRAGMA user_version = " + std::to_string(v)`.
bool documentedException(const std::string& file, const std::vector<Token>& t, std::size_t literal) {
    if (fs::path(file).filename() != "Schema.cpp" || t[literal].text != "PRAGMA user_version = ") return false;
    static const std::vector<std::string> rest{"+", "std", "::", "to_string", "(", "v", ")", ")"};
    if (literal + rest.size() >= t.size()) return false;
    for (std::size_t k = 0; k < rest.size(); ++k)
        if (t[literal + 1 + k].text != rest[k]) return false;
    return true;
}

struct StorageScan {
    std::vector<Finding> findings;
    std::size_t sqlCalls = 0;
    std::size_t sqlLiterals = 0;
    std::size_t exceptionsUsed = 0;
};

void scanStorageSource(const std::string& file, std::string_view source, StorageScan& scan) {
    const auto t = tokenize(source);
    static const std::array<std::string_view, 7> sqlCalls{"prepare", "cached", "execute", "rows", "sqlite3_prepare_v2", "sqlite3_prepare_v3", "sqlite3_exec"};
    for (std::size_t i = 0; i + 1 < t.size(); ++i) {
        if (t[i].kind == Token::Kind::Identifier && std::find(sqlCalls.begin(), sqlCalls.end(), t[i].text) != sqlCalls.end() && isPunct(t[i + 1], "(")) {
            ++scan.sqlCalls;
            int depth = 0;
            for (std::size_t k = i + 1; k < t.size(); ++k) {
                if (isPunct(t[k], "(")) ++depth;
                if (isPunct(t[k], ")") && --depth == 0) break;
                if (joins(t[k])) {
                    const bool allowed = k > 0 && t[k - 1].kind == Token::Kind::Literal && documentedException(file, t, k - 1);
                    if (!allowed)
                        scan.findings.push_back({file, t[k].line, t[i].text + "(...) builds its SQL with '" + t[k].text + "'"});
                }
            }
        }
        if (t[i].kind != Token::Kind::Literal || !startsLikeSql(t[i].text)) continue;
        ++scan.sqlLiterals;
        if (documentedException(file, t, i)) {
            ++scan.exceptionsUsed;
            continue;
        }
        const std::string head = "SQL literal \"" + t[i].text.substr(0, 40) + "\" ";
        if (t[i].text.find('%') != std::string::npos || t[i].text.find("{}") != std::string::npos)
            scan.findings.push_back({file, t[i].line, head + "holds a format placeholder"});
        std::size_t after = i + 1;
        while (after < t.size() && (isPunct(t[after], ")") || t[after].kind == Token::Kind::Literal)) ++after;
        std::size_t before = i;
        while (before > 0 && (isPunct(t[before - 1], "(") || isPunct(t[before - 1], "::") || t[before - 1].text == "std" ||
                              t[before - 1].text == "string" || t[before - 1].text == "string_view" || t[before - 1].kind == Token::Kind::Literal))
            --before;
        if ((after < t.size() && joins(t[after])) || (before > 0 && joins(t[before - 1])))
            scan.findings.push_back({file, t[i].line, head + "is concatenated or streamed with something else"});
    }
}

std::vector<Finding> scanOutsideStorage(const std::string& file, std::string_view source) {
    std::vector<Finding> out;
    if (source.find("sqlite3.h") != std::string_view::npos) out.push_back({file, 0, "includes or names sqlite3.h"});
    for (const auto& tok : tokenize(source)) {
        if (tok.kind == Token::Kind::Identifier && tok.text.rfind("sqlite3", 0) == 0)
            out.push_back({file, tok.line, "uses the SQLite API (" + tok.text + ") outside storage/"});
        if (tok.kind != Token::Kind::Literal) continue;
        for (const char* sql : {"SELECT ", "INSERT ", "UPDATE ", "DELETE FROM", "PRAGMA "})
            if (tok.text.find(sql) != std::string::npos) out.push_back({file, tok.line, std::string("SQL (") + sql + "...) in a string literal outside storage/"});
    }
    return out;
}

std::string readFile(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    return {std::istreambuf_iterator<char>(in), std::istreambuf_iterator<char>()};
}

bool isSource(const fs::path& p) {
    const auto e = p.extension();
    return e == ".cpp" || e == ".h" || e == ".hpp" || e == ".cc";
}

std::string describe(const std::vector<Finding>& f) {
    std::string s;
    for (const auto& x : f) s += "\n  " + x.file + ":" + std::to_string(x.line) + ": " + x.what;
    return s;
}

const fs::path kRoot = HUMWISE_SOURCE_DIR;

// --- the scanner on known snippets

StorageScan scanSnippet(const std::string& file, const std::string& code) {
    StorageScan s;
    scanStorageSource(file, code, s);
    return s;
}

TEST(SqlLintScanner, ReportsSqlBuiltFromValues) {
    const std::vector<std::string> bad = {
        R"C(auto s = m_db->prepare("SELECT id FROM motors WHERE tag = '" + tag + "'");)C",
        R"C(std::string sql = "DELETE FROM rounds WHERE id = " + std::to_string(id); m_db->execute(sql);)C",
        R"C(m_db->execute(std::string("UPDATE motors SET description = ") + description);)C",
        R"C(sqlite3_exec(db, ("INSERT INTO sites(name) VALUES ('" + name + "')").c_str(), nullptr, nullptr, nullptr);)C",
        R"C(std::ostringstream q; q << "SELECT * FROM points WHERE name = '" << name << "'"; auto s = db.prepare(q.str());)C",
        R"C(snprintf(buf, sizeof buf, "SELECT * FROM motors WHERE tag = '%s'", tag);)C",
        R"C(auto s = db.prepare(std::format("SELECT * FROM {} ORDER BY id", table));)C",
        R"C(std::string sql = R"SQL(SELECT id FROM rounds WHERE started_at = ')SQL"; sql += when; db.prepare(sql + "'");)C",
        R"C(db.execute("PRAGMA user_version = " + std::to_string(v));)C", // allowed in Schema.cpp only
        R"C(auto& s = m_db->cached(where.c_str() + 0);)C",
    };
    for (const auto& code : bad) EXPECT_FALSE(scanSnippet("storage/FleetStore.cpp", code).findings.empty()) << code;
}

TEST(SqlLintScanner, AcceptsBoundParametersCommentsAndTheDocumentedException) {
    const std::vector<std::string> good = {
        R"C(auto& s = m_db->cached("SELECT id FROM motors WHERE tag = ?1"); s.bind(1, tag);)C",
        R"C(auto s = m_db->prepare(R"SQL(SELECT a, b
             FROM t WHERE c = ?1 + 0)SQL"); s.bind(1, 1 + offset);)C",
        R"C(// m_db->prepare("SELECT * FROM t WHERE a = '" + a + "'") would be wrong
           /* so is "DELETE FROM t WHERE id = " + id */ m_db->execute("DELETE FROM t WHERE id IN (SELECT id FROM u)");)C",
        R"C(throw StorageException{{Code::Invalid, path + ": no motor '" + tag + "'"}};)C",
        R"C(raise(Code::Corrupt, path + ": the backup is damaged (PRAGMA integrity_check: " + row + ")");)C",
        "#include \"storage/Database.h\"\nconstexpr long long kMax = 1'000'000; char q = '\"'; auto s = db.prepare(\"PRAGMA user_version\");",
    };
    for (const auto& code : good) {
        const auto s = scanSnippet("storage/FleetStore.cpp", code);
        EXPECT_TRUE(s.findings.empty()) << code << describe(s.findings);
    }
    const auto schema = scanSnippet("storage/Schema.cpp", R"C(db.execute("PRAGMA user_version = " + std::to_string(v)); // ours)C");
    EXPECT_TRUE(schema.findings.empty()) << describe(schema.findings);
    EXPECT_EQ(schema.exceptionsUsed, 1u);
    const auto other = scanSnippet("storage/Schema.cpp", R"C(db.execute("PRAGMA user_version = " + std::to_string(userInput));)C");
    EXPECT_FALSE(other.findings.empty());
}

TEST(SqlLintScanner, ReportsSqliteAndSqlOutsideStorage) {
    EXPECT_FALSE(scanOutsideStorage("app/x.cpp", R"C(auto q = store.database().prepare("SELECT * FROM motors");)C").empty());
    EXPECT_FALSE(scanOutsideStorage("app/x.cpp", R"C(const char* q = R"(DELETE FROM rounds)";)C").empty());
    EXPECT_FALSE(scanOutsideStorage("app/x.cpp", "sqlite3* db = nullptr; sqlite3_open(\"x\", &db);").empty());
    EXPECT_FALSE(scanOutsideStorage("app/x.cpp", "#include <sqlite3.h>\n").empty());
    EXPECT_TRUE(scanOutsideStorage("app/x.cpp", R"C(out << "select a motor, then update the limits"; // SELECT * FROM x)C").empty());
}

// --- the tree

TEST(SqlLint, StorageBuildsNoSqlFromStrings) {
    StorageScan scan;
    std::size_t files = 0;
    for (const auto& e : fs::directory_iterator(kRoot / "storage")) {
        if (!e.is_regular_file() || !isSource(e.path())) continue;
        scanStorageSource(e.path().lexically_relative(kRoot).string(), readFile(e.path()), scan);
        ++files;
    }
    EXPECT_TRUE(scan.findings.empty()) << describe(scan.findings);
    // The scanner did see the store's SQL (FleetStore.cpp alone prepares dozens of statements).
    EXPECT_GE(files, 4u);
    EXPECT_GE(scan.sqlCalls, 40u);
    EXPECT_GE(scan.sqlLiterals, 40u);
    EXPECT_LE(scan.exceptionsUsed, 1u);
}

TEST(SqlLint, NoSqlOutsideStorage) {
    std::vector<Finding> findings;
    std::size_t files = 0;
    for (const char* top : {"app", "core", "sample_fleet"}) {
        if (!fs::is_directory(kRoot / top)) continue;
        for (const auto& e : fs::recursive_directory_iterator(kRoot / top)) {
            if (!e.is_regular_file() || !isSource(e.path())) continue;
            const auto f = scanOutsideStorage(e.path().lexically_relative(kRoot).string(), readFile(e.path()));
            findings.insert(findings.end(), f.begin(), f.end());
            ++files;
        }
    }
    EXPECT_TRUE(findings.empty()) << describe(findings);
    EXPECT_GE(files, 50u); // app/ and core/ were really read
}

} // namespace
} // namespace humwise::lint
