"""Ebullio desktop front end (Qt). The engine never imports it."""
from .refcount_guard import guard as _guard

_guard()
