// The .wq token scanner, built from Spirit X3 primitives matched at the current position.
#include "frontend/wq_lexer.h"

#include <charconv>
#include <cmath>

#include <boost/spirit/home/x3.hpp>

namespace whittle::frontend {
namespace x3 = boost::spirit::x3;

namespace {

/// Decimals need digits on both sides of the dot, so `0..n` scans as 0, .., n.
template <typename T>
struct StrictDecimal : x3::ureal_policies<T> {
    static bool const allow_leading_dot = false;
    static bool const allow_trailing_dot = false;
};

const x3::real_parser<double, StrictDecimal<double>> decimal{};
const auto identifier = x3::raw[x3::lexeme[x3::char_("a-zA-Z_") >> *x3::char_("a-zA-Z0-9_")]];
const auto string_body = x3::raw[*(x3::char_ - '"' - '\n' - '\r')];

struct Punctuation : x3::symbols<Tok> {
    Punctuation() {
        add(";", Tok::Semi)("(", Tok::LParen)(")", Tok::RParen)("[", Tok::LBracket)("]", Tok::RBracket)
            ("{", Tok::LBrace)("}", Tok::RBrace)(",", Tok::Comma)("&", Tok::Amp)("^", Tok::Caret)
            ("|", Tok::Bar)("!", Tok::Bang)("~", Tok::Tilde)("+", Tok::Plus)("-", Tok::Minus)
            ("*", Tok::Star)("/", Tok::Slash)("%", Tok::Percent)("^=", Tok::XorEq)("<->", Tok::SwapArrow)
            ("..", Tok::DotDot)("=", Tok::Assign)("==", Tok::EqEq)("@", Tok::At)
            ("<<", Tok::Shl)(">>", Tok::Shr)("<", Tok::Less)("<=", Tok::LessEq)(">", Tok::Greater)
            (">=", Tok::GreaterEq)("!=", Tok::NotEq);
    }
};
const Punctuation punctuation;

}  // namespace

const char* tok_name(Tok t) {
    switch (t) {
    case Tok::End: return "end of file";
    case Tok::Newline: return "end of line";
    case Tok::Semi: return "';'";
    case Tok::Ident: return "a name";
    case Tok::Int: return "an integer";
    case Tok::Real: return "a decimal number";
    case Tok::String: return "a string";
    case Tok::LParen: return "'('";
    case Tok::RParen: return "')'";
    case Tok::LBracket: return "'['";
    case Tok::RBracket: return "']'";
    case Tok::LBrace: return "'{'";
    case Tok::RBrace: return "'}'";
    case Tok::Comma: return "','";
    case Tok::Amp: return "'&'";
    case Tok::Caret: return "'^'";
    case Tok::Bar: return "'|'";
    case Tok::Bang: return "'!'";
    case Tok::Tilde: return "'~'";
    case Tok::Plus: return "'+'";
    case Tok::Minus: return "'-'";
    case Tok::Star: return "'*'";
    case Tok::Slash: return "'/'";
    case Tok::Percent: return "'%'";
    case Tok::XorEq: return "'^='";
    case Tok::SwapArrow: return "'<->'";
    case Tok::DotDot: return "'..'";
    case Tok::Assign: return "'='";
    case Tok::EqEq: return "'=='";
    case Tok::At: return "'@'";
    case Tok::Shl: return "'<<'";
    case Tok::Shr: return "'>>'";
    case Tok::Less: return "'<'";
    case Tok::LessEq: return "'<='";
    case Tok::Greater: return "'>'";
    case Tok::GreaterEq: return "'>='";
    case Tok::NotEq: return "'!='";
    case Tok::Bad: return "an unexpected character";
    }
    return "?";
}

Lexer::Lexer(std::string_view text)
    : begin_(text.data()), pos_(text.data()), end_(text.data() + text.size()), line_start_(text.data()) {
    // A UTF-8 byte order mark (editors on some systems write one) is not part of the program; the
    // first line's columns count from after it.
    if (text.substr(0, 3) == "\xEF\xBB\xBF") pos_ = line_start_ = text.data() + 3;
}

void Lexer::skip_blanks(bool skip_newlines) {
    while (pos_ != end_) {
        char ch = *pos_;
        if (ch == ' ' || ch == '\t' || ch == '\r' || ch == '\f' || ch == '\v') {
            ++pos_;
        } else if (ch == '#') {
            while (pos_ != end_ && *pos_ != '\n') ++pos_;
        } else if (ch == '\n' && skip_newlines) {
            ++pos_;
            ++line_;
            line_start_ = pos_;
        } else {
            return;
        }
    }
}

Token Lexer::next(bool skip_newlines) {
    skip_blanks(skip_newlines);
    Token t;
    t.line = line_;
    t.col = uint32_t(pos_ - line_start_) + 1;
    if (pos_ == end_) {
        t.kind = Tok::End;
        return t;
    }
    const char* start = pos_;
    char ch = *pos_;
    if (ch == '\n') {
        ++pos_;
        ++line_;
        line_start_ = pos_;
        t.kind = Tok::Newline;
        t.text = std::string_view(start, 1);
        return t;
    }
    boost::iterator_range<const char*> range;
    if (x3::parse(pos_, end_, identifier, range)) {
        t.kind = Tok::Ident;
        t.text = std::string_view(start, size_t(pos_ - start));
        return t;
    }
    if (ch == '`') {  // `name`: a name the printer had to quote because it is also a keyword
        const char* p = pos_ + 1;
        if (x3::parse(p, end_, identifier, range) && p != end_ && *p == '`') {
            pos_ = p + 1;
            t.kind = Tok::Ident;
            t.quoted = true;
            t.text = std::string_view(start + 1, size_t(p - start - 1));
            return t;
        }
    }
    if (ch >= '0' && ch <= '9') {
        // Only digits followed by '.', 'e' or 'E' can be a decimal; plain integers skip that attempt.
        const char* digits_end = pos_;
        while (digits_end != end_ && *digits_end >= '0' && *digits_end <= '9') ++digits_end;
        const bool maybe_real = digits_end != end_ && (*digits_end == '.' || *digits_end == 'e' || *digits_end == 'E');
        const char* p = pos_;
        double d = 0;
        if (maybe_real && x3::parse(p, end_, decimal, d)) {
            std::string_view s(start, size_t(p - start));
            if (s.find_first_of(".eE") != std::string_view::npos) {
                pos_ = p;
                t.kind = Tok::Real;
                // X3 finds the literal's extent; from_chars rounds correctly, so 17 printed digits
                // read back to the same double.
                auto r = std::from_chars(s.data(), s.data() + s.size(), d);
                t.dval = r.ec == std::errc() ? d : HUGE_VAL;
                t.text = s;
                return t;
            }
        }
        uint64_t v = 0;
        t.kind = Tok::Int;
        if (!x3::parse(pos_, end_, x3::ulong_long, v)) {
            t.overflow = true;
            while (pos_ != end_ && *pos_ >= '0' && *pos_ <= '9') ++pos_;
        }
        t.ival = v;
        t.text = std::string_view(start, size_t(pos_ - start));
        return t;
    }
    if (ch == '"') {
        ++pos_;
        const char* body = pos_;
        x3::parse(pos_, end_, string_body, range);
        t.text = std::string_view(body, size_t(pos_ - body));
        if (pos_ == end_ || *pos_ != '"') {
            t.kind = Tok::Bad;
            t.text = "\"";
            return t;
        }
        ++pos_;
        t.kind = Tok::String;
        return t;
    }
    Tok kind = Tok::Bad;
    if (x3::parse(pos_, end_, punctuation, kind)) {
        t.kind = kind;
        t.text = std::string_view(start, size_t(pos_ - start));
        return t;
    }
    // One unexpected character, or one whole UTF-8 sequence so the message shows it intact.
    ++pos_;
    while (pos_ != end_ && (static_cast<unsigned char>(*pos_) & 0xC0) == 0x80 &&
           (static_cast<unsigned char>(ch) & 0x80)) ++pos_;
    t.kind = Tok::Bad;
    t.text = std::string_view(start, size_t(pos_ - start));
    return t;
}

}  // namespace whittle::frontend
