"""PDF release report (reportlab); renders Result records, holds no formula."""
