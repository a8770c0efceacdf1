/*
 * yamltree.c - strict YAML node tree with positions: a file read whole,
 * the tree built from it, and its nodes (new, copy, free, push, find).
 *
 * Built from libyaml's event API (yaml_parser_parse, libyaml 0.2,
 * pyyaml.org/wiki/LibYAML) with an explicit stack, so no recursion on the
 * input; the YAML 1.2 specification (yaml.org/spec/1.2.2) defines the
 * anchors, aliases and tags refused here. See yamltree.h for the rules.
 * The schema checker and the readers of a checked map, which use the tree
 * but not libyaml, are in yamltree_schema.c.
 */
#include <errno.h>
#include <fcntl.h>
#include <limits.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>
#include <yaml.h>

#include "io/yamltree.h"

/* First allocation of the file buffer, bytes. */
#define READ_CHUNK 4096u
/* Longest scalar quoted in full in a "found ..." message, characters. */
#define DESCRIBE_MAX 40

/* ---- files ------------------------------------------------------------- */

static void errno_text(int err, char *buf, size_t size)
{
    if (strerror_r(err, buf, size) != 0)
        snprintf(buf, size, "error %d", err);
}

plumb_status plumby_read_file(const char *path, size_t max_bytes, char **buf, size_t *len,
                              plumb_diag *diag)
{
    char why[128];
    *buf = NULL;
    *len = 0;
    int fd = open(path, O_RDONLY | O_CLOEXEC);
    if (fd < 0) {
        errno_text(errno, why, sizeof why);
        return PLUMB_RAISE_AT(diag, PLUMB_EIO, path, 0, 0, NULL, "cannot open the file: %s", why);
    }
    struct stat st;
    if (fstat(fd, &st) != 0) {
        errno_text(errno, why, sizeof why);
        close(fd);
        return PLUMB_RAISE_AT(diag, PLUMB_EIO, path, 0, 0, NULL, "cannot stat the file: %s", why);
    }
    if (S_ISDIR(st.st_mode)) {
        close(fd);
        return PLUMB_RAISE_AT(diag, PLUMB_EIO, path, 0, 0, NULL,
                              "is a directory, expected a YAML file");
    }
    if (S_ISREG(st.st_mode) && (unsigned long long)st.st_size > max_bytes) {
        close(fd);
        return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, path, 0, 0, NULL,
                              "the file has %lld bytes; at most %zu bytes are accepted",
                              (long long)st.st_size, max_bytes);
    }
    size_t cap = READ_CHUNK, n = 0;
    char *b = malloc(cap);
    if (!b) {
        close(fd);
        return PLUMB_RAISE_AT(diag, PLUMB_ENOMEM, path, 0, 0, NULL, "out of memory reading the file");
    }
    for (;;) {
        if (n + 1 >= cap) {
            if (cap > max_bytes + 1) {
                free(b);
                close(fd);
                return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, path, 0, 0, NULL,
                                      "the file is longer than %zu bytes, the most accepted",
                                      max_bytes);
            }
            char *nb = realloc(b, cap * 2);
            if (!nb) {
                free(b);
                close(fd);
                return PLUMB_RAISE_AT(diag, PLUMB_ENOMEM, path, 0, 0, NULL,
                                      "out of memory reading the file");
            }
            b = nb;
            cap *= 2;
        }
        ssize_t got = read(fd, b + n, cap - 1 - n);
        if (got < 0 && errno == EINTR)
            continue;
        if (got < 0) {
            errno_text(errno, why, sizeof why);
            free(b);
            close(fd);
            return PLUMB_RAISE_AT(diag, PLUMB_EIO, path, 0, 0, NULL, "cannot read the file: %s",
                                  why);
        }
        if (got == 0)
            break;
        n += (size_t)got;
        if (n > max_bytes) {
            free(b);
            close(fd);
            return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, path, 0, 0, NULL,
                                  "the file is longer than %zu bytes, the most accepted",
                                  max_bytes);
        }
    }
    close(fd);
    b[n] = '\0';
    *buf = b;
    *len = n;
    return PLUMB_OK;
}

/* ---- nodes ------------------------------------------------------------- */

plumby_node *plumby_new(plumby_kind kind, int line, int col, plumby_origin origin)
{
    plumby_node *n = calloc(1, sizeof *n);
    if (!n)
        return NULL;
    n->kind = kind;
    n->line = line;
    n->col = col;
    n->origin = origin;
    n->plain = 1;
    return n;
}

void plumby_free(plumby_node *node)
{
    if (!node)
        return;
    free(node->text);
    for (size_t i = 0; i < node->n; i++) {
        if (node->kind == PLUMBY_SEQ) {
            plumby_free(node->items[i]);
        } else if (node->kind == PLUMBY_MAP) {
            free(node->pairs[i].key);
            plumby_free(node->pairs[i].value);
        }
    }
    free(node->items);
    free(node->pairs);
    free(node);
}

static char *dup_text(const char *s, size_t n)
{
    char *d = malloc(n + 1);
    if (!d)
        return NULL;
    memcpy(d, s, n);
    d[n] = '\0';
    return d;
}

plumby_node *plumby_copy(const plumby_node *node)
{
    plumby_node *c = plumby_new(node->kind, node->line, node->col, node->origin);
    if (!c)
        return NULL;
    c->plain = node->plain;
    if (node->text && !(c->text = dup_text(node->text, strlen(node->text))))
        goto fail;
    for (size_t i = 0; i < node->n; i++) {
        if (node->kind == PLUMBY_SEQ) {
            plumby_node *it = plumby_copy(node->items[i]);
            if (!it)
                goto fail;
            if (plumby_seq_push(c, it) != PLUMB_OK) {
                plumby_free(it);
                goto fail;
            }
        } else {
            const plumby_pair *p = &node->pairs[i];
            plumby_node *v = plumby_copy(p->value);
            if (!v)
                goto fail;
            if (plumby_map_push(c, p->key, p->line, p->col, p->origin, v) != PLUMB_OK) {
                plumby_free(v);
                goto fail;
            }
        }
    }
    return c;
fail:
    plumby_free(c);
    return NULL;
}

plumb_status plumby_seq_push(plumby_node *seq, plumby_node *item)
{
    if (seq->n == seq->cap) {
        size_t cap = seq->cap ? 2 * seq->cap : 4;
        plumby_node **ni = realloc(seq->items, cap * sizeof *ni);
        if (!ni)
            return PLUMB_ENOMEM;
        seq->items = ni;
        seq->cap = cap;
    }
    seq->items[seq->n++] = item;
    return PLUMB_OK;
}

plumb_status plumby_map_push(plumby_node *map, const char *key, int line, int col,
                             plumby_origin origin, plumby_node *value)
{
    if (map->n == map->cap) {
        size_t cap = map->cap ? 2 * map->cap : 4;
        plumby_pair *np = realloc(map->pairs, cap * sizeof *np);
        if (!np)
            return PLUMB_ENOMEM;
        map->pairs = np;
        map->cap = cap;
    }
    char *k = dup_text(key, strlen(key));
    if (!k)
        return PLUMB_ENOMEM;
    map->pairs[map->n++] = (plumby_pair){k, line, col, origin, value};
    return PLUMB_OK;
}

plumby_pair *plumby_find(const plumby_node *map, const char *key)
{
    if (!map || map->kind != PLUMBY_MAP)
        return NULL;
    for (size_t i = 0; i < map->n; i++)
        if (strcmp(map->pairs[i].key, key) == 0)
            return &map->pairs[i];
    return NULL;
}

int plumby_is_null(const plumby_node *node)
{
    if (!node || node->kind != PLUMBY_SCALAR || !node->plain)
        return 0;
    const char *t = node->text;
    return t[0] == '\0' || strcmp(t, "~") == 0 || strcmp(t, "null") == 0 ||
           strcmp(t, "Null") == 0 || strcmp(t, "NULL") == 0;
}

const char *plumby_describe(const plumby_node *node, char *buf, size_t size)
{
    if (node->kind == PLUMBY_MAP)
        snprintf(buf, size, "a map");
    else if (node->kind == PLUMBY_SEQ)
        snprintf(buf, size, "a list");
    else if (plumby_is_null(node))
        snprintf(buf, size, "an empty value");
    else if (strlen(node->text) > DESCRIBE_MAX)
        snprintf(buf, size, "'%.*s...'", DESCRIBE_MAX, node->text);
    else
        snprintf(buf, size, "'%s'", node->text);
    return buf;
}

/* ---- parsing ----------------------------------------------------------- */

/* Line and column (1-based, in characters) of byte offset off of buf. */
static void offset_pos(const char *buf, size_t len, size_t off, int *line, int *col)
{
    int l = 1, c = 1;
    if (off > len)
        off = len;
    for (size_t i = 0; i < off; i++) {
        unsigned char ch = (unsigned char)buf[i];
        if (ch == '\n' || (ch == '\r' && (i + 1 >= len || buf[i + 1] != '\n'))) {
            l++;
            c = 1;
        } else if (ch != '\r' && (ch & 0xC0u) != 0x80u) {
            c++;
        }
    }
    *line = l;
    *col = c;
}

/* Byte offset of 0-based line and character column (a libyaml mark) in
 * buf; len when past the end. */
static size_t mark_offset(const char *buf, size_t len, size_t line, size_t column)
{
    size_t i = 0;
    for (size_t l = 0; l < line && i < len; i++)
        if (buf[i] == '\n' || (buf[i] == '\r' && (i + 1 >= len || buf[i + 1] != '\n')))
            l++;
    for (size_t c = 0; c < column && i < len; i++)
        if (((unsigned char)buf[i] & 0xC0u) != 0x80u && ++c == column)
            while (i + 1 < len && ((unsigned char)buf[i + 1] & 0xC0u) == 0x80u)
                i++;
    return i;
}

/* Offset of the first tab that indents a line: one in the white space at
 * the start of a line, or after a "- ", "? " or ": " that opens it (YAML
 * 1.2.2, 6.1: tabs are never indentation). Tabs elsewhere (before or in a
 * comment, between a key and its value) separate tokens, which YAML
 * allows; libyaml judges them. Returns len when there is none. */
static size_t indent_tab(const char *buf, size_t len)
{
    size_t i = 0;
    while (i < len) {
        for (;;) {
            while (i < len && (buf[i] == ' ' || buf[i] == '\t')) {
                if (buf[i] == '\t')
                    return i;
                i++;
            }
            if (i + 1 < len && (buf[i] == '-' || buf[i] == '?' || buf[i] == ':') &&
                (buf[i + 1] == ' ' || buf[i + 1] == '\t'))
                i++;
            else
                break;
        }
        while (i < len && buf[i] != '\n' && buf[i] != '\r')
            i++;
        while (i < len && (buf[i] == '\n' || buf[i] == '\r'))
            i++;
    }
    return len;
}

typedef struct builder {
    const char *buf;                         /* the text parsed (for positions) */
    size_t len;
    const char *file;
    plumby_origin origin;
    int col_offset;
    const char *key_prefix;
    plumb_diag *diag;
    plumby_node *root;
    size_t depth;                            /* open containers */
    plumby_node *stack[PLUMBY_MAX_DEPTH];    /* open containers, borrowed */
    char *pkey[PLUMBY_MAX_DEPTH];            /* map level: key awaiting its value (owned) */
    int pline[PLUMBY_MAX_DEPTH], pcol[PLUMBY_MAX_DEPTH];
} builder;

static int out_col(const builder *b, int line, int col)
{
    return line == 1 ? col + b->col_offset : col;
}

/* Dotted key of the position being built, with `last` appended. Open
 * containers are attached to their parent when they start, so the open
 * child of every level but the innermost is its parent's last entry. */
static void builder_key(const builder *b, const char *last, char *buf, size_t size)
{
    char tmp[PLUMB_DIAG_KEY];
    plumbp_strlcpy(buf, b->key_prefix ? b->key_prefix : "", size);
    for (size_t i = 0; i < b->depth; i++) {
        const plumby_node *n = b->stack[i];
        int inner = i + 1 == b->depth;
        if (n->kind == PLUMBY_SEQ) {
            if (!inner && n->n == 0)
                continue;
            plumby_key_join(tmp, sizeof tmp, buf, NULL, inner ? n->n : n->n - 1);
        } else if (inner && b->pkey[i]) {
            plumby_key_join(tmp, sizeof tmp, buf, b->pkey[i], 0);
        } else if (!inner && n->n > 0) {
            plumby_key_join(tmp, sizeof tmp, buf, n->pairs[n->n - 1].key, 0);
        } else {
            continue;
        }
        plumbp_strlcpy(buf, tmp, size);
    }
    if (last) {
        plumby_key_join(tmp, sizeof tmp, buf, last, 0);
        plumbp_strlcpy(buf, tmp, size);
    }
}

PLUMBP_PRINTF(6, 7)
static plumb_status builder_raise(const builder *b, plumb_status st, int line, int col,
                                  const char *last, const char *fmt, ...)
{
    char key[PLUMB_DIAG_KEY];
    builder_key(b, last, key, sizeof key);
    va_list ap;
    va_start(ap, fmt);
    plumbp_vraise(b->diag, st, b->file, line, col, key, fmt, ap);
    va_end(ap);
    return st;
}

/* Hands a finished or just-opened node to its parent (or makes it the
 * root). On error the node is freed. */
static plumb_status attach(builder *b, plumby_node *node)
{
    if (b->depth == 0) {
        b->root = node;
        return PLUMB_OK;
    }
    size_t lv = b->depth - 1;
    plumby_node *parent = b->stack[lv];
    plumb_status st;
    if (parent->kind == PLUMBY_SEQ) {
        st = plumby_seq_push(parent, node);
        if (st != PLUMB_OK) {
            plumby_free(node);
            return PLUMB_RAISE(b->diag, st, "out of memory building the YAML tree");
        }
        return PLUMB_OK;
    }
    if (!b->pkey[lv]) {
        /* node is a key */
        if (node->kind != PLUMBY_SCALAR) {
            st = builder_raise(b, PLUMB_EPARSE, node->line, node->col, NULL,
                               "a key must be a plain word, found %s",
                               node->kind == PLUMBY_MAP ? "a map" : "a list");
            plumby_free(node);
            return st;
        }
        const plumby_pair *first = plumby_find(parent, node->text);
        if (first) {
            st = builder_raise(b, PLUMB_EKEY, node->line, node->col, node->text,
                               "duplicate key '%s' (first given at line %d, column %d)",
                               node->text, first->line, first->col);
            plumby_free(node);
            return st;
        }
        if (parent->n >= PLUMBY_MAX_KEYS) {
            st = builder_raise(b, PLUMB_ERANGE, node->line, node->col, NULL,
                               "more than %d keys in one map", PLUMBY_MAX_KEYS);
            plumby_free(node);
            return st;
        }
        b->pkey[lv] = node->text;
        b->pline[lv] = node->line;
        b->pcol[lv] = node->col;
        node->text = NULL;
        plumby_free(node);
        return PLUMB_OK;
    }
    st = plumby_map_push(parent, b->pkey[lv], b->pline[lv], b->pcol[lv], b->origin, node);
    if (st != PLUMB_OK) {
        plumby_free(node);
        return PLUMB_RAISE(b->diag, st, "out of memory building the YAML tree");
    }
    free(b->pkey[lv]);
    b->pkey[lv] = NULL;
    return PLUMB_OK;
}

static plumb_status parser_error(const builder *b, const yaml_parser_t *p, const char *buf,
                                 size_t len)
{
    const char *problem = p->problem ? p->problem : "unknown problem";
    if (p->error == YAML_MEMORY_ERROR)
        return PLUMB_RAISE(b->diag, PLUMB_ENOMEM, "out of memory parsing YAML");
    if (p->error == YAML_READER_ERROR) {
        int line, col;
        size_t off = p->problem_offset;
        /* a broken multi-byte sequence is reported where it starts */
        if (strstr(problem, "trailing") && off <= len) {
            while (off > 0 && ((unsigned char)buf[off - 1] & 0xC0u) == 0x80u)
                off--;
            if (off > 0 && (unsigned char)buf[off - 1] >= 0xC0u)
                off--;
        }
        offset_pos(buf, len, off, &line, &col);
        col = out_col(b, line, col);
        const char *what = strstr(problem, "UTF-8") ? "the text is not valid UTF-8: " : "";
        if (p->problem_value >= 0)
            return builder_raise(b, PLUMB_EPARSE, line, col, NULL, "%s%s (0x%02X)", what,
                                 problem, (unsigned)p->problem_value);
        return builder_raise(b, PLUMB_EPARSE, line, col, NULL, "%s%s", what, problem);
    }
    int line = (int)p->problem_mark.line + 1, col = (int)p->problem_mark.column + 1;
    /* libyaml may point just past the text (a line it added at the end) */
    int end_line, end_col;
    offset_pos(buf, len, len, &end_line, &end_col);
    if (line > end_line || (line == end_line && col > end_col)) {
        line = end_line;
        col = end_col;
    }
    col = out_col(b, line, col);
    if (p->context) {
        int cl = (int)p->context_mark.line + 1, cc = (int)p->context_mark.column + 1;
        return builder_raise(b, PLUMB_EPARSE, line, col, NULL,
                             "malformed YAML: %s (%s that starts at line %d, column %d)", problem,
                             p->context, cl, out_col(b, cl, cc));
    }
    return builder_raise(b, PLUMB_EPARSE, line, col, NULL, "malformed YAML: %s", problem);
}

/* Refuses anchors and tags on a node event. */
static plumb_status check_props(const builder *b, const yaml_char_t *anchor,
                                const yaml_char_t *tag, int line, int col)
{
    if (anchor)
        return builder_raise(b, PLUMB_EPARSE, line, col, NULL,
                             "YAML anchors (&%s) are not allowed; write the value out",
                             (const char *)anchor);
    if (tag)
        return builder_raise(b, PLUMB_EPARSE, line, col, NULL,
                             "YAML tags (%s) are not allowed", (const char *)tag);
    return PLUMB_OK;
}

static plumb_status handle_event(builder *b, const yaml_event_t *ev, int *docs, int *done)
{
    int line = (int)ev->start_mark.line + 1;
    int col = out_col(b, line, (int)ev->start_mark.column + 1);
    plumby_node *node;
    plumb_status st;
    switch (ev->type) {
    case YAML_DOCUMENT_START_EVENT:
        if (++*docs > 1)
            return builder_raise(b, PLUMB_EPARSE, line, col, NULL,
                                 "a second YAML document: a profile holds exactly one");
        return PLUMB_OK;
    case YAML_STREAM_END_EVENT:
        *done = 1;
        return PLUMB_OK;
    case YAML_ALIAS_EVENT:
        return builder_raise(b, PLUMB_EPARSE, line, col, NULL,
                             "YAML aliases (*%s) are not allowed; write the value out",
                             (const char *)ev->data.alias.anchor);
    case YAML_SCALAR_EVENT:
        st = check_props(b, ev->data.scalar.anchor, ev->data.scalar.tag, line, col);
        if (st != PLUMB_OK)
            return st;
        if (memchr(ev->data.scalar.value, '\0', ev->data.scalar.length))
            return builder_raise(b, PLUMB_EPARSE, line, col, NULL,
                                 "a NUL character inside a value");
        if (memchr(ev->data.scalar.value, '\t', ev->data.scalar.length)) {
            /* where the tab is written, if it is (not a "\t" escape) */
            size_t from = mark_offset(b->buf, b->len, ev->start_mark.line, ev->start_mark.column);
            size_t to = mark_offset(b->buf, b->len, ev->end_mark.line, ev->end_mark.column);
            const char *t = from < to ? memchr(b->buf + from, '\t', to - from) : NULL;
            int tl = line, tc = col;
            if (t) {
                offset_pos(b->buf, b->len, (size_t)(t - b->buf), &tl, &tc);
                tc = out_col(b, tl, tc);
            }
            return builder_raise(b, PLUMB_EPARSE, tl, tc, NULL,
                                 "a tab character inside a value: write spaces");
        }
        node = plumby_new(PLUMBY_SCALAR, line, col, b->origin);
        if (!node || !(node->text = dup_text((const char *)ev->data.scalar.value,
                                             ev->data.scalar.length))) {
            plumby_free(node);
            return PLUMB_RAISE(b->diag, PLUMB_ENOMEM, "out of memory building the YAML tree");
        }
        node->plain = ev->data.scalar.style == YAML_PLAIN_SCALAR_STYLE;
        return attach(b, node);
    case YAML_SEQUENCE_START_EVENT:
    case YAML_MAPPING_START_EVENT:
        if (ev->type == YAML_SEQUENCE_START_EVENT)
            st = check_props(b, ev->data.sequence_start.anchor, ev->data.sequence_start.tag,
                             line, col);
        else
            st = check_props(b, ev->data.mapping_start.anchor, ev->data.mapping_start.tag,
                             line, col);
        if (st != PLUMB_OK)
            return st;
        if (b->depth >= PLUMBY_MAX_DEPTH)
            return builder_raise(b, PLUMB_ERANGE, line, col, NULL,
                                 "nesting deeper than %d levels", PLUMBY_MAX_DEPTH);
        node = plumby_new(ev->type == YAML_SEQUENCE_START_EVENT ? PLUMBY_SEQ : PLUMBY_MAP, line,
                          col, b->origin);
        if (!node)
            return PLUMB_RAISE(b->diag, PLUMB_ENOMEM, "out of memory building the YAML tree");
        st = attach(b, node);
        if (st != PLUMB_OK)
            return st;
        b->stack[b->depth] = node;
        b->pkey[b->depth] = NULL;
        b->depth++;
        return PLUMB_OK;
    case YAML_SEQUENCE_END_EVENT:
    case YAML_MAPPING_END_EVENT:
        if (b->depth > 0) {
            b->depth--;
            free(b->pkey[b->depth]);
            b->pkey[b->depth] = NULL;
        }
        return PLUMB_OK;
    default:
        return PLUMB_OK;
    }
}

plumb_status plumby_parse(const char *buf, size_t len, const char *file, plumby_origin origin,
                          int col_offset, const char *key_prefix, plumby_node **out,
                          plumb_diag *diag)
{
    *out = NULL;
    builder b;
    memset(&b, 0, sizeof b);
    b.file = file;
    b.origin = origin;
    b.col_offset = col_offset;
    b.key_prefix = key_prefix;
    b.diag = diag;

    /* A UTF-8 byte-order mark (written by some editors) is not content;
     * libyaml would skip it only when left to detect the encoding itself. */
    if (len >= 3 && memcmp(buf, "\xEF\xBB\xBF", 3) == 0) {
        buf += 3;
        len -= 3;
    }
    b.buf = buf;
    b.len = len;
    size_t tab = indent_tab(buf, len);
    if (tab < len) {
        int line, col;
        offset_pos(buf, len, tab, &line, &col);
        col = out_col(&b, line, col);
        return builder_raise(&b, PLUMB_EPARSE, line, col, NULL,
                             "a tab character in the indentation: YAML indents with spaces only");
    }

    yaml_parser_t parser;
    if (!yaml_parser_initialize(&parser))
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory starting the YAML parser");
    yaml_parser_set_input_string(&parser, (const unsigned char *)buf, len);
    yaml_parser_set_encoding(&parser, YAML_UTF8_ENCODING);

    plumb_status st = PLUMB_OK;
    int docs = 0, done = 0;
    while (!done && st == PLUMB_OK) {
        yaml_event_t ev;
        if (!yaml_parser_parse(&parser, &ev)) {
            st = parser_error(&b, &parser, buf, len);
            break;
        }
        st = handle_event(&b, &ev, &docs, &done);
        yaml_event_delete(&ev);
    }
    yaml_parser_delete(&parser);
    for (size_t i = 0; i < b.depth; i++)
        free(b.pkey[i]);
    if (st == PLUMB_OK && (!b.root || plumby_is_null(b.root))) {
        int line = 1, col = out_col(&b, 1, 1);
        if (b.root) {
            line = b.root->line;
            col = b.root->col;
        }
        b.depth = 0;
        st = builder_raise(&b, PLUMB_EPARSE, line, col, NULL,
                           b.root ? "the YAML document is empty"
                                  : "no YAML document: the text is empty or only comments");
    }
    if (st != PLUMB_OK) {
        plumby_free(b.root);
        return st;
    }
    *out = b.root;
    return PLUMB_OK;
}
