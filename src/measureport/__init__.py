"""measureport: port business measures to SQL warehouses and prove the port is right."""

__version__ = "0.1.0"
