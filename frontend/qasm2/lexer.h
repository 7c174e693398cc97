// Tokens of OpenQASM 2.0 source text (arXiv:1707.03429), read one at a time with their locations.
#pragma once

#include <cstdint>
#include <string>
#include <string_view>

#include "ir/source_loc.h"

namespace whittle::frontend::qasm2 {

enum class Tok : uint8_t {
    End, Ident, Int, Real, String,
    Semi, Comma, LParen, RParen, LBracket, RBracket, LBrace, RBrace,
    Arrow, EqEq, Plus, Minus, Star, Slash, Caret,
};

struct Token {
    Tok kind = Tok::End;
    std::string_view text;  ///< identifier, number or string contents (without quotes), a view of the source
    ir::SourceLoc loc;
};

/// How a token kind reads in "expected ..." messages, e.g. "';'" or "a number".
const char* token_name(Tok t);

/// A streaming lexer with one token of lookahead; tokens view the text, which must outlive them. Skips whitespace, `//` and `/* */` comments and a
/// leading UTF-8 byte order mark; throws a located UserError on a character that starts no token.
class Lexer {
public:
    Lexer(std::string_view text, uint32_t file_id);
    const Token& peek() const { return next_; }
    Token take() {
        Token t = next_;
        next_ = scan();
        return t;
    }

private:
    Token scan();
    void skip_space_and_comments();
    ir::SourceLoc here() const { return ir::SourceLoc{uint16_t(file_), line_, col_}; }  // ids fit: see SourceManager::add
    void advance();
    void skip_digits();

    std::string_view text_;
    size_t pos_ = 0;
    uint32_t file_ = 0;
    uint32_t line_ = 1;
    uint32_t col_ = 1;
    Token next_;
};

}  // namespace whittle::frontend::qasm2
