// The OpenQASM 2.0 lexer.
#include "frontend/qasm2/lexer.h"

#include <fmt/format.h>

#include "ir/error.h"

namespace whittle::frontend::qasm2 {
namespace {

bool is_ident_start(char c) { return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z'); }
bool is_ident_char(char c) { return is_ident_start(c) || (c >= '0' && c <= '9') || c == '_'; }
bool is_digit(char c) { return c >= '0' && c <= '9'; }

std::string describe_char(char c) {
    unsigned char u = static_cast<unsigned char>(c);
    if (u >= 33 && u < 127) return fmt::format("'{}'", c);
    return fmt::format("byte 0x{:02x}", u);
}

}  // namespace

const char* token_name(Tok t) {
    switch (t) {
    case Tok::End: return "the end of the file";
    case Tok::Ident: return "a name";
    case Tok::Int: return "an integer";
    case Tok::Real: return "a number";
    case Tok::String: return "a string";
    case Tok::Semi: return "';'";
    case Tok::Comma: return "','";
    case Tok::LParen: return "'('";
    case Tok::RParen: return "')'";
    case Tok::LBracket: return "'['";
    case Tok::RBracket: return "']'";
    case Tok::LBrace: return "'{'";
    case Tok::RBrace: return "'}'";
    case Tok::Arrow: return "'->'";
    case Tok::EqEq: return "'=='";
    case Tok::Plus: return "'+'";
    case Tok::Minus: return "'-'";
    case Tok::Star: return "'*'";
    case Tok::Slash: return "'/'";
    case Tok::Caret: return "'^'";
    }
    return "?";
}

Lexer::Lexer(std::string_view text, uint32_t file_id) : text_(text), file_(file_id) {
    if (text_.substr(0, 3) == "\xEF\xBB\xBF") pos_ = 3;
    next_ = scan();
}

void Lexer::advance() {
    if (text_[pos_] == '\n') {
        ++line_;
        col_ = 1;
    } else {
        ++col_;
    }
    ++pos_;
}

void Lexer::skip_digits() {
    size_t start = pos_;
    while (pos_ < text_.size() && is_digit(text_[pos_])) ++pos_;
    col_ += uint32_t(pos_ - start);
}

void Lexer::skip_space_and_comments() {
    while (pos_ < text_.size()) {
        char c = text_[pos_];
        if (c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v') {
            ++pos_;
            ++col_;
        } else if (c == '\n') {
            ++pos_;
            ++line_;
            col_ = 1;
        } else if (c == '/' && pos_ + 1 < text_.size() && text_[pos_ + 1] == '/') {
            while (pos_ < text_.size() && text_[pos_] != '\n') advance();
        } else if (c == '/' && pos_ + 1 < text_.size() && text_[pos_ + 1] == '*') {
            ir::SourceLoc start = here();
            advance();
            advance();
            while (pos_ < text_.size() && !(text_[pos_] == '*' && pos_ + 1 < text_.size() && text_[pos_ + 1] == '/'))
                advance();
            if (pos_ >= text_.size()) throw UserError("comment is not closed: expected '*/'", start);
            advance();
            advance();
        } else {
            return;
        }
    }
}

Token Lexer::scan() {
    skip_space_and_comments();
    Token t;
    t.loc = here();
    if (pos_ >= text_.size()) return t;
    char c = text_[pos_];
    auto single = [&](Tok k) {
        advance();
        t.kind = k;
        return t;
    };
    if (is_ident_start(c)) {
        size_t start = pos_;
        while (pos_ < text_.size() && is_ident_char(text_[pos_])) ++pos_;  // no line end inside: only the column moves
        col_ += uint32_t(pos_ - start);
        t.kind = Tok::Ident;
        t.text = text_.substr(start, pos_ - start);
        return t;
    }
    if (is_digit(c) || (c == '.' && pos_ + 1 < text_.size() && is_digit(text_[pos_ + 1]))) {
        size_t start = pos_;
        bool real = false;
        skip_digits();
        if (pos_ < text_.size() && text_[pos_] == '.') {
            real = true;
            advance();
            skip_digits();
        }
        if (pos_ < text_.size() && (text_[pos_] == 'e' || text_[pos_] == 'E')) {
            size_t save_pos = pos_;
            uint32_t save_col = col_;
            advance();
            if (pos_ < text_.size() && (text_[pos_] == '+' || text_[pos_] == '-')) advance();
            if (pos_ < text_.size() && is_digit(text_[pos_])) {
                real = true;
                skip_digits();
            } else {
                pos_ = save_pos;  // not an exponent: leave the 'e' for the next token
                col_ = save_col;
            }
        }
        t.kind = real ? Tok::Real : Tok::Int;
        t.text = text_.substr(start, pos_ - start);
        return t;
    }
    switch (c) {
    case ';': return single(Tok::Semi);
    case ',': return single(Tok::Comma);
    case '(': return single(Tok::LParen);
    case ')': return single(Tok::RParen);
    case '[': return single(Tok::LBracket);
    case ']': return single(Tok::RBracket);
    case '{': return single(Tok::LBrace);
    case '}': return single(Tok::RBrace);
    case '+': return single(Tok::Plus);
    case '*': return single(Tok::Star);
    case '/': return single(Tok::Slash);
    case '^': return single(Tok::Caret);
    case '-':
        advance();
        if (pos_ < text_.size() && text_[pos_] == '>') {
            advance();
            t.kind = Tok::Arrow;
            return t;
        }
        t.kind = Tok::Minus;
        return t;
    case '=':
        advance();
        if (pos_ < text_.size() && text_[pos_] == '=') {
            advance();
            t.kind = Tok::EqEq;
            return t;
        }
        throw UserError("expected '==' (OpenQASM 2.0 has no assignment)", t.loc);
    case '"': {
        advance();
        size_t start = pos_;
        while (pos_ < text_.size() && text_[pos_] != '"' && text_[pos_] != '\n') advance();
        if (pos_ >= text_.size() || text_[pos_] != '"') throw UserError("string is not closed: expected '\"'", t.loc);
        t.kind = Tok::String;
        t.text = text_.substr(start, pos_ - start);
        advance();
        return t;
    }
    default:
        throw UserError(fmt::format("unexpected {} in OpenQASM 2.0 source", describe_char(c)), t.loc);
    }
}

}  // namespace whittle::frontend::qasm2
