"""The design's data model: frozen dataclasses in SI, criteria, materials, citations."""
