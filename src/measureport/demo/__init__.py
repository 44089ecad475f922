"""The bike-share demo: an invented network's model, measures and seeded data.

``writer.write_demo`` writes the example folder, ``generator.generate_data`` only its data
files, and ``showcase.SHOWCASE`` lists the queries that ``measureport demo`` prints.
"""
