// Tokens of the .wq language, scanned on demand (Spirit X3 primitives over the whole text, no copies).
#pragma once

#include <cstdint>
#include <string_view>

namespace whittle::frontend {

enum class Tok : uint8_t {
    End, Newline, Semi, Ident, Int, Real, String,
    LParen, RParen, LBracket, RBracket, LBrace, RBrace, Comma,
    Amp, Caret, Bar, Bang, Tilde, Plus, Minus, Star, Slash, Percent,
    XorEq, SwapArrow, DotDot, Assign, EqEq, At,
    Shl, Shr, Less, LessEq, Greater, GreaterEq, NotEq,  ///< compile-time integer operators
    Bad,  ///< a character that starts no token (text holds it)
};

/// How a token kind is named in "expected ..., found ..." messages.
const char* tok_name(Tok t);

struct Token {
    Tok kind = Tok::End;
    uint32_t line = 1, col = 1;
    std::string_view text;  ///< points into the source text
    uint64_t ival = 0;      ///< Int
    double dval = 0.0;      ///< Real
    bool overflow = false;  ///< Int literal too large for 64 bits
    bool quoted = false;    ///< Ident written as `name`: a plain name even when it is a keyword or 'pi'
};

/// Scans one token at a time. Newlines are tokens (they end statements) except inside ( ) and [ ],
/// where the parser asks to skip them.
class Lexer {
public:
    explicit Lexer(std::string_view text);
    /// The next token; `skip_newlines` treats line ends as blanks.
    Token next(bool skip_newlines);

private:
    void skip_blanks(bool skip_newlines);
    const char* begin_;
    const char* pos_;
    const char* end_;
    uint32_t line_ = 1;
    const char* line_start_;
};

}  // namespace whittle::frontend
