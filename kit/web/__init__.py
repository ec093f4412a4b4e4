# SPDX-License-Identifier: MIT
"""The browser face of kit (``kit serve``): pages rendered on the server over the service layer.

Like the command line, it is a face: every page calls :mod:`kit.services` (and writes files
through :mod:`kit.files` as the commands do), and runs no query and no rule of its own.

``app``     the application: its pages, error pages and the guard in front of them
``guard``   who may ask: the start token and session cookie, the Host header, CSRF tokens, upload
            sizes, security headers
``render``  the templates, and the values every page shows (navigation, caution, CSRF field)
``pages``   one module per page: fleet, vessel, order, suppliers, particulars
``uploads``       an uploaded file saved for the services to read by path, refusals said of it as uploaded
``upload_forms``  a form's upload field checked (one file, a suffix the reader takes, not empty) and read
``notices``       what a POST did, carried by the browser to the page it redirects to (post/redirect/get)
``sent_files``    a file written by kit.files into a temporary folder and sent as a download
"""
