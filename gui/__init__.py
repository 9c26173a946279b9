"""Ebullio desktop front end (Qt). The engine never imports it."""
