"""Ebullio desktop front end (Qt). Built in its own issue; the engine never imports it."""
