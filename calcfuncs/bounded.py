"""Bounded in-memory caches: one way of keeping an entry, used by every module.

The core keeps recent results (nodes, days, search windows, whole cells) in plain
dicts so that a recalculation finds them; each dict has a size stated beside it, and
``keep`` is the only way entries go in, so no cache can outgrow its bound.
"""

OLDEST = "oldest"
NEWEST = "newest"


def keep(cache, key, value, size, evict=OLDEST):
    """``cache[key] = value``, first making room when ``cache`` holds ``size`` entries.

    ``OLDEST`` drops the first entry kept (insertion order), which suits caches filled
    by forward searches; ``NEWEST`` drops the last one, which lets a top-to-bottom pass
    over a sheet larger than the cache keep finding its first ``size`` cells.
    """
    if key not in cache and len(cache) >= size:
        if evict == NEWEST:
            cache.popitem()
        else:
            del cache[next(iter(cache))]
    cache[key] = value
