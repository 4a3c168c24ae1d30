/**
 * Source text of the header-only C99 reference evaluator (emitted by the C output, and compiled by the
 * tests). It reads the binary pack of docs/runtime-format.md byte by byte (little-endian, any host),
 * verifies magic, version, size and CRC-32, and evaluates a curve in float arithmetic with the formulas
 * of ../table.ts (glTF 2.0 Appendix C for the Hermite kernel).
 */
export const C_EVALUATOR = String.raw`/* tangentry.h: reference evaluator for Tangentry baked tables. C99, header-only, no allocation.
 * Pack format: docs/runtime-format.md. Evaluation: right-continuous, clamped outside [start, end];
 * linear: v0 + s(v1 - v0); hermite: (2s^3-3s^2+1)v0 + H(s^3-2s^2+s)m0 + (-2s^3+3s^2)v1 + H(s^3-s^2)m1. */
#ifndef TANGENTRY_H
#define TANGENTRY_H
#include <stddef.h>
#include <stdint.h>
#include <string.h>

enum { TG_LINEAR = 0, TG_HERMITE = 1 };
enum { TG_UNIFORM = 0, TG_ADAPTIVE = 1 };
enum { TG_F32 = 0, TG_F16 = 1, TG_UNORM16 = 2, TG_UNORM8 = 3 };
enum { TG_OK = 0, TG_ERR_SIZE = -1, TG_ERR_MAGIC = -2, TG_ERR_VERSION = -3, TG_ERR_CRC = -4, TG_ERR_INDEX = -5 };

typedef struct tg_curve {
  const char *name;          /* UTF-8, NUL-terminated, inside the pack */
  uint8_t kernel, layout, encoding;
  uint32_t count;
  float start, end;
  float value_offset, value_scale, slope_offset, slope_scale;
  const uint8_t *times;      /* count little-endian float32 (adaptive only) */
  const uint8_t *values;     /* count codes */
  const uint8_t *slopes;     /* count codes (hermite only) */
} tg_curve;

typedef struct tg_pack { const uint8_t *bytes; size_t size; uint32_t count; } tg_pack;

static uint32_t tg_u32(const uint8_t *p) { return (uint32_t)p[0] | ((uint32_t)p[1] << 8) | ((uint32_t)p[2] << 16) | ((uint32_t)p[3] << 24); }
static uint16_t tg_u16(const uint8_t *p) { return (uint16_t)(p[0] | (p[1] << 8)); }
static float tg_f32(const uint8_t *p) { uint32_t b = tg_u32(p); float f; memcpy(&f, &b, 4); return f; }

/* IEEE 754 binary16 -> binary32 (exact). */
static float tg_f16(uint16_t h) {
  uint32_t sign = (uint32_t)(h & 0x8000u) << 16, exp = (h >> 10) & 0x1fu, frac = h & 0x3ffu, bits;
  float f;
  if (exp == 0) { f = (float)frac * 5.9604644775390625e-8f; return sign ? -f : f; } /* frac * 2^-24 */
  bits = exp == 31 ? (sign | 0x7f800000u | (frac << 13)) : (sign | ((exp + 112u) << 23) | (frac << 13));
  memcpy(&f, &bits, 4);
  return f;
}

/* CRC-32 (reflected 0xEDB88320, init and final XOR 0xFFFFFFFF), bitwise. */
static uint32_t tg_crc32(const uint8_t *p, size_t n) {
  uint32_t c = 0xffffffffu; size_t i; int k;
  for (i = 0; i < n; i++) { c ^= p[i]; for (k = 0; k < 8; k++) c = (c & 1u) ? (0xedb88320u ^ (c >> 1)) : (c >> 1); }
  return c ^ 0xffffffffu;
}

static int tg_pack_open(tg_pack *pk, const uint8_t *bytes, size_t size) {
  if (size < 36) return TG_ERR_SIZE;
  if (memcmp(bytes, "TGPK", 4) != 0) return TG_ERR_MAGIC;
  if (tg_u16(bytes + 4) != 1) return TG_ERR_VERSION;
  if (tg_u32(bytes + 24) != size) return TG_ERR_SIZE;
  if (tg_crc32(bytes, size - 4) != tg_u32(bytes + size - 4)) return TG_ERR_CRC;
  pk->bytes = bytes; pk->size = size; pk->count = tg_u32(bytes + 8);
  return TG_OK;
}

static int tg_pack_curve(const tg_pack *pk, uint32_t i, tg_curve *c) {
  const uint8_t *e; const uint8_t *d; uint32_t n, vb;
  if (i >= pk->count) return TG_ERR_INDEX;
  e = pk->bytes + tg_u32(pk->bytes + 12) + 48u * i;
  c->name = (const char *)(pk->bytes + tg_u32(e));
  c->kernel = e[8]; c->layout = e[9]; c->encoding = e[10];
  c->count = n = tg_u32(e + 12);
  c->start = tg_f32(e + 16); c->end = tg_f32(e + 20);
  c->value_offset = tg_f32(e + 24); c->value_scale = tg_f32(e + 28);
  c->slope_offset = tg_f32(e + 32); c->slope_scale = tg_f32(e + 36);
  d = pk->bytes + tg_u32(e + 40);
  vb = c->encoding == TG_F32 ? 4u : c->encoding == TG_UNORM8 ? 1u : 2u;
  c->times = 0; c->slopes = 0;
  if (c->layout == TG_ADAPTIVE) { c->times = d; d += 4u * n; }
  c->values = d; d += (vb * n + 3u) & ~3u;
  if (c->kernel == TG_HERMITE) c->slopes = d;
  return TG_OK;
}

static float tg_decode(uint8_t enc, const uint8_t *base, uint32_t i, float off, float scale) {
  switch (enc) {
    case TG_F32: return tg_f32(base + 4u * i);
    case TG_F16: return tg_f16(tg_u16(base + 2u * i));
    case TG_UNORM16: return off + scale * ((float)tg_u16(base + 2u * i) / 65535.0f);
    default: return off + scale * ((float)base[i] / 255.0f);
  }
}

static float tg_eval(const tg_curve *c, float t) {
  uint32_t n = c->count, k;
  float t0, t1, H, s, v0, v1;
  if (c->layout == TG_UNIFORM) {
    float h;
    if (t <= c->start) return tg_decode(c->encoding, c->values, 0, c->value_offset, c->value_scale);
    if (t >= c->end) return tg_decode(c->encoding, c->values, n - 1, c->value_offset, c->value_scale);
    h = (c->end - c->start) / (float)(n - 1);
    k = (uint32_t)((t - c->start) / h);
    if (k > n - 2) k = n - 2;
    t0 = c->start + (float)k * h;
    t1 = k + 2 == n ? c->end : c->start + (float)(k + 1) * h;
  } else {
    uint32_t lo = 0, hi = n - 1;
    if (t < tg_f32(c->times)) return tg_decode(c->encoding, c->values, 0, c->value_offset, c->value_scale);
    if (t >= tg_f32(c->times + 4u * (n - 1))) return tg_decode(c->encoding, c->values, n - 1, c->value_offset, c->value_scale);
    while (hi - lo > 1) { uint32_t mid = (lo + hi) >> 1; if (tg_f32(c->times + 4u * mid) <= t) lo = mid; else hi = mid; }
    k = lo; t0 = tg_f32(c->times + 4u * k); t1 = tg_f32(c->times + 4u * (k + 1));
  }
  H = t1 - t0;
  s = (t - t0) / H;
  v0 = tg_decode(c->encoding, c->values, k, c->value_offset, c->value_scale);
  v1 = tg_decode(c->encoding, c->values, k + 1, c->value_offset, c->value_scale);
  if (c->kernel == TG_LINEAR) return v0 + s * (v1 - v0);
  {
    float m0 = tg_decode(c->encoding, c->slopes, k, c->slope_offset, c->slope_scale);
    float m1 = tg_decode(c->encoding, c->slopes, k + 1, c->slope_offset, c->slope_scale);
    float s2 = s * s, s3 = s2 * s;
    return (2.0f * s3 - 3.0f * s2 + 1.0f) * v0 + H * (s3 - 2.0f * s2 + s) * m0 + (-2.0f * s3 + 3.0f * s2) * v1 + H * (s3 - s2) * m1;
  }
}

#endif /* TANGENTRY_H */
`;
