/*
** rng.c -- Philox4x32-10, the counter-based generator of the sampler
** See Copyright Notice in LICENSE
**
** Salmon, Moraes, Dror & Shaw 2011, "Parallel random numbers: as easy as
** 1, 2, 3" (SC11): ten rounds of a Feistel-like network on four 32-bit
** words, each round two 32x32 -> 64-bit products (multipliers
** 0xD2511F53, 0xCD9E8D57), the key bumped by the Weyl constants
** 0x9E3779B9, 0xBB67AE85 between rounds.  Checked against the published
** known-answer vectors (tests/test_sampler.c, suite rng).
**
** Streams: key = seed; counter = (draw index low, high, stream low, high).
** Each block of the counter gives four words: two doubles of 53 bits.
*/

#include "sampler/internal.h"

#define PHILOX_M0 0xD2511F53u
#define PHILOX_M1 0xCD9E8D57u
#define PHILOX_W0 0x9E3779B9u
#define PHILOX_W1 0xBB67AE85u


void bl_philox4x32_10 (const uint32_t ctr[4], const uint32_t key[2],
                       uint32_t out[4]) {
  uint32_t c0 = ctr[0], c1 = ctr[1], c2 = ctr[2], c3 = ctr[3];
  uint32_t k0 = key[0], k1 = key[1];
  int r;
  for (r = 0; r < 10; r++) {
    uint64_t p0 = (uint64_t)PHILOX_M0 * c0, p1 = (uint64_t)PHILOX_M1 * c2;
    uint32_t hi0 = (uint32_t)(p0 >> 32), lo0 = (uint32_t)p0;
    uint32_t hi1 = (uint32_t)(p1 >> 32), lo1 = (uint32_t)p1;
    c0 = hi1 ^ c1 ^ k0;
    c1 = lo1;
    c2 = hi0 ^ c3 ^ k1;
    c3 = lo0;
    k0 += PHILOX_W0;
    k1 += PHILOX_W1;
  }
  out[0] = c0;
  out[1] = c1;
  out[2] = c2;
  out[3] = c3;
}


void bl_rng_init (bl_rng *r, uint64_t seed, uint64_t stream) {
  if (r == NULL)
    return;
  r->key[0] = (uint32_t)seed;
  r->key[1] = (uint32_t)(seed >> 32);
  r->stream = stream;
  r->ctr = 0;
  r->used = 4;
}


static void refill (bl_rng *r) {
  uint32_t c[4];
  c[0] = (uint32_t)r->ctr;
  c[1] = (uint32_t)(r->ctr >> 32);
  c[2] = (uint32_t)r->stream;
  c[3] = (uint32_t)(r->stream >> 32);
  bl_philox4x32_10(c, r->key, r->buf);
  r->ctr++;
  r->used = 0;
}


uint64_t bl_rng_u64 (bl_rng *r) {
  uint64_t v;
  if (r->used > 2)
    refill(r);
  v = (uint64_t)r->buf[r->used] | ((uint64_t)r->buf[r->used + 1] << 32);
  r->used += 2;
  return v;
}


double bl_rng_uniform (bl_rng *r) {
  return (double)(bl_rng_u64(r) >> 11) * 0x1.0p-53;
}
