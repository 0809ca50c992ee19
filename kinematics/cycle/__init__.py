"""cycle"""
